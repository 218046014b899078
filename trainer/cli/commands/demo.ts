import type { Command } from "commander";
import type { DataFormat } from "../../data/write-columns.js";
import { runDemo } from "../../demo/run-demo.js";
import { parseChoice, parseNonNegativeInteger, parsePositiveInteger } from "../parse-options.js";

const formats: readonly DataFormat[] = ["csv", "ndjson", "parquet", "arrow"];

interface DemoCommandOptions {
  readonly out: string;
  readonly days: number;
  readonly rowsPerDay: number;
  readonly seed: number;
  readonly format: DataFormat;
}

/** `leafcast demo`: the whole job on the built-in Plotline scenario, report included. */
export function registerDemoCommand(program: Command): void {
  program
    .command("demo")
    .description(
      "Run the whole job end to end on the built-in Plotline scenario, ending with the visual report (report.html in the output folder).",
    )
    .option("-o, --out <dir>", "folder for everything the demo writes", "runs/demo")
    .option("--days <n>", "days of logs", parsePositiveInteger, 42)
    .option("--rows-per-day <n>", "impressions per day", parsePositiveInteger, 20_000)
    .option("--seed <n>", "random seed", parseNonNegativeInteger, 1)
    .option(
      "-f, --format <format>",
      `log file format: ${formats.join(", ")}`,
      parseChoice(formats),
      "csv",
    )
    .action(async (options: DemoCommandOptions) => {
      await runDemo({ ...options, log: (line) => process.stdout.write(`${line}\n`) });
    });
}
