import { readFile } from "node:fs/promises";
import type { Command } from "commander";
import { InvalidArgumentError } from "commander";
import { checkArtifact } from "../../../scorer/check-artifact.js";
import { formatLatencyTable } from "../../artifact/format-latency-table.js";
import { latencyRow } from "../../artifact/latency-row.js";
import { latencyTable } from "../../artifact/latency-table.js";
import type { LatencyRow } from "../../artifact/latency-row.js";
import { syntheticItems } from "../../artifact/synthetic-items.js";
import { writeFileAtomic } from "../../io/write-file-atomic.js";
import { scoreItemsFromFile } from "../../pipeline/score-items-from-file.js";
import { loadDatasetSchema } from "../../schema/load-dataset-schema.js";
import { parseJsonText } from "../../schema/parse-json-file.js";
import { parsePositiveInteger } from "../parse-options.js";

interface LatencyCommandOptions {
  readonly scorer?: string;
  readonly items?: string;
  readonly schema?: string;
  readonly count: number;
  readonly trees: number[];
  readonly depths: number[];
  readonly repetitions: number;
  readonly json?: string;
}

/** `leafcast latency`: per-item latency distribution and batch throughput, trees and heads apart. */
export function registerLatencyCommand(program: Command): void {
  program
    .command("latency")
    .description(
      "Measure scoring latency on one thread: single-item p50/p90/p99/p99.9/max and batch ns per item, split into trees and heads. " +
        "With --scorer, of that artifact; without, of generated artifacts of each --trees and --depths.",
    )
    .option("-a, --scorer <path>", "a trained scorer artifact to time")
    .option(
      "--items <file>",
      "with --scorer: take items from this data file (needs --schema); default generated items",
    )
    .option("-s, --schema <path>", "dataset schema of --items")
    .option("--count <n>", "items to score", parsePositiveInteger, 2000)
    .option("--trees <list>", "tree counts of generated artifacts", parseList, [100, 300, 1000])
    .option("--depths <list>", "depths of generated artifacts", parseList, [6, 8])
    .option("--repetitions <n>", "timed passes over the items", parsePositiveInteger, 5)
    .option("--json <path>", "also write the figures as JSON")
    .action(async (options: LatencyCommandOptions) => {
      let rows: LatencyRow[];
      if (options.scorer !== undefined) {
        const text = await readFile(options.scorer, "utf8");
        const artifact = checkArtifact(parseJsonText(text, options.scorer, "artifact"));
        let items = syntheticItems(options.count);
        if (options.items !== undefined) {
          if (options.schema === undefined)
            throw new InvalidArgumentError("--items needs --schema");
          items = await scoreItemsFromFile(
            options.items,
            await loadDatasetSchema(options.schema),
            options.count,
          );
        }
        rows = [latencyRow(artifact, items, { repetitions: options.repetitions })];
      } else {
        rows = latencyTable({
          trees: options.trees,
          depths: options.depths,
          items: options.count,
          repetitions: options.repetitions,
          onRow: (row) =>
            process.stderr.write(`latency: ${row.trees} trees of depth ${row.depth} measured\n`),
        });
      }
      process.stdout.write(`${formatLatencyTable(rows)}\n`);
      if (options.json !== undefined)
        await writeFileAtomic(options.json, `${JSON.stringify(rows, null, 2)}\n`);
    });
}

function parseList(text: string): number[] {
  const values = text.split(",").map((part) => Number(part.trim()));
  if (values.length === 0 || values.some((v) => !Number.isSafeInteger(v) || v < 1)) {
    throw new InvalidArgumentError(`expected whole numbers separated by commas, found "${text}"`);
  }
  return values;
}
