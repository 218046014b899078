import { InvalidArgumentError, type Command } from "commander";
import { formatPruningTable } from "../../pruning/format-pruning-table.js";
import { pruneFeatures, type PruneFeaturesResult } from "../../pruning/prune-features.js";
import { pruningReportInput } from "../../pruning/pruning-report-input.js";
import { writeReducedSchema } from "../../pruning/write-reduced-schema.js";
import { writeReport } from "../../report/write-report.js";
import { loadDatasetSchema } from "../../schema/load-dataset-schema.js";
import { loadConfigOption } from "../load-config-option.js";
import { parsePositiveInteger } from "../parse-options.js";

interface PruneFeaturesCommandOptions {
  readonly schema: string;
  readonly config?: string;
  readonly dropPerStep: number;
  readonly minFeatures: number;
  readonly neTolerance: number;
  readonly heldOut: number;
  readonly protect: string[];
  readonly withHeads?: boolean;
  readonly schemaOut?: string;
  readonly report?: string;
  readonly quiet?: boolean;
  readonly json?: boolean;
}

/**
 * `leafcast prune-features FILES... --schema S [--schema-out pruned.json] [--report r.html]`:
 * drops the weakest features step by step, refitting the trees each time, and prints
 * held-out NE against the features kept.
 */
export function registerPruneFeaturesCommand(program: Command): void {
  program
    .command("prune-features")
    .description(
      "Drop the weakest tree features step by step (unused ones first, then by gain), refit the forests and report held-out NE against the number of features kept; optionally write the reduced dataset schema.",
    )
    .argument("<files...>", "data files to fit and hold out rows from")
    .requiredOption("-s, --schema <path>", "dataset schema (JSON)")
    .option("-c, --config <path>", "training configuration (JSON); defaults otherwise")
    .option(
      "--drop-per-step <n>",
      "features dropped per refit: a whole number, or a share of those kept such as 0.2 or 20%",
      parseDropPerStep,
      1,
    )
    .option("--min-features <n>", "never keep fewer features", parsePositiveInteger, 1)
    .option(
      "--ne-tolerance <share>",
      "stop when held-out NE of any outcome is worse than with every feature by more than this share",
      parseShare,
      0.002,
    )
    .option(
      "--held-out <share>",
      "share of rows held out: the latest by time when the schema has a timestamp, else a seeded draw",
      parseHeldOut,
      0.2,
    )
    .option("--protect <names>", "comma-separated features never to drop", parseNames, [])
    .option(
      "--with-heads",
      "measure NE of trees plus heads (heads learned at every step) instead of each forest alone",
    )
    .option(
      "--schema-out <path>",
      "write the reduced dataset schema here (dropped columns ignored)",
    )
    .option(
      "--report <path>",
      "write an HTML report with the importance bars and the pruning chart",
    )
    .option("-q, --quiet", "no line per refit")
    .option("--json", "print a JSON summary")
    .action(async (files: string[], options: PruneFeaturesCommandOptions) => {
      const schema = await loadDatasetSchema(options.schema);
      const config = await loadConfigOption(options.config);
      const log = (line: string): void => {
        if (options.quiet !== true && options.json !== true) process.stderr.write(`${line}\n`);
      };
      const result = await pruneFeatures(files, schema, config, {
        dropPerStep: options.dropPerStep,
        minFeatures: options.minFeatures,
        neTolerance: options.neTolerance,
        heldOutFraction: options.heldOut,
        protect: options.protect,
        measure: options.withHeads === true ? "hybrid" : "trees",
        onStep: (s) =>
          log(
            `prune-features: ${s.featuresKept} features, held-out NE ${Object.entries(s.heldOutNe)
              .map(([o, ne]) => `${o} ${ne.toFixed(5)}`)
              .join(", ")}`,
          ),
      });
      if (options.schemaOut !== undefined) {
        await writeReducedSchema(options.schemaOut, schema, result.dropped);
      }
      if (options.report !== undefined) {
        const input = pruningReportInput(result, {
          data: files.join(", "),
          schemaPath: options.schemaOut,
        });
        await writeReport(options.report, input);
      }
      if (options.json === true) {
        process.stdout.write(`${JSON.stringify(jsonSummary(result, options), null, 2)}\n`);
        return;
      }
      const held = result.heldOutBy === "time" ? "the latest by time" : "a seeded draw";
      const measured =
        result.measure === "hybrid" ? "NE of trees plus heads" : "NE of each forest alone";
      const wrote = [options.schemaOut, options.report].filter((p) => p !== undefined);
      process.stdout.write(
        `prune-features: ${result.trainRows} training rows, ${result.heldOutRows} held out (${held}); ${measured}\n` +
          formatPruningTable(result) +
          (wrote.length > 0 ? `wrote ${wrote.join(", ")}\n` : ""),
      );
    });
}

function jsonSummary(result: PruneFeaturesResult, options: PruneFeaturesCommandOptions): object {
  return {
    schemaOut: options.schemaOut ?? null,
    report: options.report ?? null,
    trainRows: result.trainRows,
    heldOutRows: result.heldOutRows,
    heldOutBy: result.heldOutBy,
    measure: result.measure,
    stopReason: result.stopReason,
    kept: result.kept,
    dropped: result.dropped,
    // Importance of the fit with every feature: combined over forests, and the unused.
    importance: result.steps[0].importance.combined,
    unused: result.steps[0].importance.unused,
    steps: result.steps.map((s) => ({
      featuresKept: s.featuresKept,
      heldOutNe: s.heldOutNe,
      dropped: s.dropped,
      accepted: s.accepted,
    })),
  };
}

/** A whole number >= 1, or a share in (0, 1) written as 0.2 or 20%. */
function parseDropPerStep(text: string): number {
  const value = text.endsWith("%") ? Number(text.slice(0, -1)) / 100 : Number(text);
  if (!(value > 0 && (value < 1 || Number.isSafeInteger(value)))) {
    throw new InvalidArgumentError(
      `expected a whole number >= 1 or a share in (0, 1) such as 0.2 or 20%, found "${text}"`,
    );
  }
  return value;
}

/** A number in [0, 1), as 0.002 or 0.2%. */
function parseShare(text: string): number {
  const value = text.endsWith("%") ? Number(text.slice(0, -1)) / 100 : Number(text);
  if (!(value >= 0 && value < 1) || text.trim() === "") {
    throw new InvalidArgumentError(
      `expected a share in [0, 1) such as 0.002 or 0.2%, found "${text}"`,
    );
  }
  return value;
}

/** A share strictly between 0 and 1, for the held-out rows (some must be held out). */
function parseHeldOut(text: string): number {
  const value = parseShare(text);
  if (value === 0) {
    throw new InvalidArgumentError(`expected a share in (0, 1) such as 0.2, found "${text}"`);
  }
  return value;
}

function parseNames(text: string): string[] {
  return text
    .split(",")
    .map((s) => s.trim())
    .filter((s) => s.length > 0);
}
