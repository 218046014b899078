import type { Command } from "commander";
import { removeFileIfPresent } from "../../io/remove-file-if-present.js";
import { fitTreesFromFile } from "../../trees/fit-trees-from-file.js";
import type { TreeProgress } from "../../trees/fit-forests.js";
import { writeForestFile } from "../../trees/write-forest-file.js";
import { summarizeForests } from "../../trees/summarize-forests.js";
import { loadDatasetSchema } from "../../schema/load-dataset-schema.js";
import { loadConfigOption } from "../load-config-option.js";
import { parseNonNegativeInteger } from "../parse-options.js";
import { formatDuration } from "../progress-line.js";

interface FitTreesOptions {
  readonly schema: string;
  readonly config?: string;
  readonly out: string;
  readonly skipBadRows?: boolean;
  readonly rejects?: string;
  readonly quiet?: boolean;
  readonly json?: boolean;
  readonly checkpointSeconds?: number;
  readonly restart?: boolean;
}

/** `leafcast fit-trees FILES... --schema S --out forests.json`: fits one forest per outcome. */
export function registerFitTreesCommand(program: Command): void {
  program
    .command("fit-trees")
    .description(
      "Fit one boosted forest per outcome on a sample of the given logs and save them (the feature transforms every head reads).",
    )
    .argument("<files...>", "data files of the fit window")
    .requiredOption("-s, --schema <path>", "dataset schema (JSON)")
    .option("-c, --config <path>", "training configuration (JSON); defaults otherwise")
    .requiredOption(
      "-o, --out <path>",
      "forest file to write (JSON, written atomically); progress is kept in <out>.checkpoint until it is",
    )
    .option("--skip-bad-rows", "count and set aside bad rows instead of stopping at the first")
    .option("--rejects <path>", "with --skip-bad-rows: write the bad rows here (NDJSON)")
    .option(
      "--checkpoint-seconds <s>",
      "also save a checkpoint every this many seconds (besides every checkpoint.everyTrees trees)",
      parseNonNegativeInteger,
    )
    .option("--restart", "ignore a checkpoint left by an earlier run and start over")
    .option("-q, --quiet", "no line per tree")
    .option("--json", "print a JSON summary")
    .action(async (files: string[], options: FitTreesOptions) => {
      const schema = await loadDatasetSchema(options.schema);
      const config = await loadConfigOption(options.config);
      const log = (line: string): void => {
        if (options.quiet !== true && options.json !== true) process.stderr.write(`${line}\n`);
      };
      const checkpointPath = `${options.out}.checkpoint`;
      const result = await fitTreesFromFile(files, schema, config, {
        badRows: options.skipBadRows === true ? "skip" : "fail",
        rejectsPath: options.rejects,
        onProgress: (p) => log(renderTreeProgress(p)),
        checkpointPath,
        checkpointSeconds: options.checkpointSeconds,
        restart: options.restart,
        onResume: (trees) => log(`fit-trees: resuming from ${checkpointPath} (${trees} trees)`),
      });
      await writeForestFile(options.out, result.forests);
      // Only once the forests are safely in place: a kill before this resumes from the checkpoint.
      await removeFileIfPresent(checkpointPath);
      const summary = summarizeForests(result.forests);
      if (options.json === true) {
        const body = {
          out: options.out,
          rowsRead: result.rowsRead,
          rowsSampled: result.rowsSampled,
          forests: summary,
        };
        process.stdout.write(`${JSON.stringify(body, null, 2)}\n`);
        return;
      }
      process.stdout.write(
        `fit-trees: ${result.rowsSampled} of ${result.rowsRead} rows sampled; wrote ${options.out}\n` +
          summary
            .map(
              (f) =>
                `  ${f.outcome}: ${f.trees} trees, log loss ${f.startLoss.toFixed(5)} -> ${f.trainLoss.toFixed(5)} (train)` +
                (f.validationLoss === null ? "" : `, ${f.validationLoss.toFixed(5)} (validation)`) +
                `; top features by gain: ${f.topFeatures.join(", ")}`,
            )
            .join("\n") +
          "\n",
      );
    });
}

/** One line per tree: losses, elapsed and time left. */
export function renderTreeProgress(p: TreeProgress): string {
  const validation = p.validationLoss === null ? "" : `, validation ${p.validationLoss.toFixed(5)}`;
  return (
    `forest ${p.forest}/${p.forests} ${p.outcome}: tree ${p.tree}/${p.trees}, train log loss ${p.trainLoss.toFixed(5)}${validation}, ` +
    `${formatDuration(p.elapsedSeconds)} elapsed, ${formatDuration(p.secondsLeft)} left`
  );
}
