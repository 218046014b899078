import { mkdir } from "node:fs/promises";
import { join } from "node:path";
import type { Command } from "commander";
import { writePlotline } from "../../../datasets/plotline/write-plotline.js";
import { writePlotlineDays } from "../../../datasets/plotline/write-plotline-days.js";
import type { DataFormat } from "../../data/write-columns.js";
import { formatCount } from "../progress-line.js";
import { parseChoice, parseNonNegativeInteger, parsePositiveInteger } from "../parse-options.js";

const formats: readonly DataFormat[] = ["csv", "ndjson", "parquet", "arrow"];

interface ScenarioOptions {
  readonly out: string;
  readonly format: DataFormat;
  readonly days: number;
  readonly rowsPerDay: number;
  readonly seed: number;
  readonly startDate?: string;
  readonly newPostTypeDay?: number;
  readonly layoutChangeDay?: number;
  readonly oneFile?: boolean;
  readonly json?: boolean;
}

/** `leafcast scenario`: writes Plotline scenario logs, one file per day by default. */
export function registerScenarioCommand(program: Command): void {
  program
    .command("scenario")
    .description(
      "Write logs of Plotline, an invented community app for allotment gardeners, with known true probabilities and built-in drift.",
    )
    .requiredOption("-o, --out <dir>", "folder for the files (created when missing)")
    .option(
      "-f, --format <format>",
      `file format: ${formats.join(", ")}`,
      parseChoice(formats),
      "csv",
    )
    .option("--days <n>", "days of logs", parsePositiveInteger, 42)
    .option("--rows-per-day <n>", "impressions per day", parsePositiveInteger, 50_000)
    .option(
      "--seed <n>",
      "random seed; the same seed gives byte-identical files",
      parseNonNegativeInteger,
      1,
    )
    .option("--start-date <yyyy-mm-dd>", "first day (default 2025-06-02, early summer)")
    .option(
      "--new-post-type-day <n>",
      "day plot tours first appear (default 22)",
      parsePositiveInteger,
    )
    .option(
      "--layout-change-day <n>",
      "day the new feed layout goes live (default 29)",
      parsePositiveInteger,
    )
    .option("--one-file", "write all days into one file, plotline.<format>")
    .option("--json", "print the written files as JSON")
    .action(async (options: ScenarioOptions) => {
      await mkdir(options.out, { recursive: true });
      const plotline = {
        seed: options.seed,
        days: options.days,
        rowsPerDay: options.rowsPerDay,
        startDate: options.startDate,
        newPostTypeDay: options.newPostTypeDay,
        layoutChangeDay: options.layoutChangeDay,
      };
      const started = performance.now();
      const written =
        options.oneFile === true
          ? [
              await writePlotline(
                join(options.out, `plotline.${options.format}`),
                options.format,
                plotline,
              ),
            ]
          : await writePlotlineDays(options.out, options.format, plotline);
      const seconds = (performance.now() - started) / 1000;
      const rows = written.reduce((sum, w) => sum + w.rows, 0);
      if (options.json === true) {
        process.stdout.write(`${JSON.stringify({ files: written, rows, seconds }, null, 2)}\n`);
        return;
      }
      process.stdout.write(
        `scenario: wrote ${formatCount(rows)} rows in ${written.length} ${options.format} file(s) under ${options.out} ` +
          `in ${seconds.toFixed(1)} s (${formatCount(rows / seconds)} rows/s); schema: datasets/plotline.schema.json\n`,
      );
    });
}
