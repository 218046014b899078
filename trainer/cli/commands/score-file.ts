import { readFile } from "node:fs/promises";
import type { Command } from "commander";
import { loadScorer } from "../../../scorer/load-scorer.js";
import { detectDataFormat } from "../../data/detect-data-format.js";
import { openDataFile } from "../../data/open-data-file.js";
import type { WrittenBatch, WrittenColumn } from "../../data/write-columns.js";
import { writeDataFile } from "../../data/write-data-file.js";
import { loadDatasetSchema } from "../../schema/load-dataset-schema.js";
import { ProgressLine } from "../progress-line.js";

interface ScoreOptions {
  readonly scorer: string;
  readonly schema: string;
  readonly out: string;
  readonly skipBadRows?: boolean;
  readonly rejects?: string;
}

/** `leafcast score FILE --scorer A --schema S --out scores.csv`: per-outcome probabilities and the combined score. */
export function registerScoreCommand(program: Command): void {
  program
    .command("score")
    .description(
      "Score a data file with a scorer artifact: one row out per row in, with each outcome's probability and the combined ranking score.",
    )
    .argument("<file>", "data file to score")
    .requiredOption("-a, --scorer <path>", "scorer artifact (JSON)")
    .requiredOption("-s, --schema <path>", "dataset schema of the data file")
    .requiredOption(
      "-o, --out <path>",
      "scores to write; the format follows the extension (.csv, .ndjson, .parquet, .arrow)",
    )
    .option("--skip-bad-rows", "count and set aside bad rows instead of stopping at the first")
    .option("--rejects <path>", "with --skip-bad-rows: write the bad rows here (NDJSON)")
    .action(async (file: string, options: ScoreOptions) => {
      const scorer = loadScorer(await readFile(options.scorer, "utf8"));
      const schema = await loadDatasetSchema(options.schema);
      const reader = openDataFile(file, schema, {
        badRows: options.skipBadRows === true ? "skip" : "fail",
        rejectsPath: options.rejects,
      });
      const columns: WrittenColumn[] = [
        ...scorer.outcomes.map((o): WrittenColumn => ({ name: `p_${o}`, type: "float64" })),
        { name: "combined", type: "float64" },
      ];
      const progress = new ProgressLine(`score ${file}`, "rows");
      let rows = 0;
      async function* scored(): AsyncGenerator<WrittenBatch> {
        for await (const batch of reader.batches()) {
          const scores = scorer.scoreBatch(batch);
          const out: Record<string, Float64Array> = { combined: scores.combined };
          for (const outcome of scorer.outcomes) out[`p_${outcome}`] = scores.probability[outcome];
          rows += batch.rowCount;
          progress.update(rows);
          yield { rowCount: batch.rowCount, columns: out };
        }
      }
      const summary = await writeDataFile(
        options.out,
        detectDataFormat(options.out),
        columns,
        scored(),
      );
      progress.finish();
      const rejected =
        reader.stats.rowsRejected > 0 ? `, ${reader.stats.rowsRejected} rows rejected` : "";
      process.stdout.write(`score: wrote ${summary.rows} rows to ${summary.path}${rejected}\n`);
    });
}
