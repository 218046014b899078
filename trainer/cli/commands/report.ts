import { type Command, InvalidArgumentError } from "commander";
import { writeReport } from "../../report/write-report.js";
import { summarizeReport } from "../../report/summarize-report.js";
import { loadDatasetSchema } from "../../schema/load-dataset-schema.js";
import { listDayFiles } from "../../study/list-day-files.js";
import { runFreshnessStudy } from "../../study/run-freshness-study.js";
import { studyReportInput } from "../../study/study-report-input.js";
import { loadConfigOption } from "../load-config-option.js";
import { parsePositiveInteger } from "../parse-options.js";

interface ReportCommandOptions {
  readonly schema: string;
  readonly config?: string;
  readonly out: string;
  readonly windowDays: number;
  readonly fitDays?: number;
  readonly refitDays: number | "all";
  readonly driftFromDay?: number;
  readonly psiThreshold: number;
  readonly segmentBy?: string;
  readonly baselines: boolean;
  readonly title?: string;
  readonly skipBadRows?: boolean;
  readonly quiet?: boolean;
}

/**
 * `leafcast report DAYS... --schema S --out report.html`: runs the freshness study
 * over day files and writes the visual report, then prints its short summary.
 */
export function registerReportCommand(program: Command): void {
  program
    .command("report")
    .description(
      "Replay day files in windows: score frozen, head-updated and refit models on each window, measure tree staleness, write one self-contained HTML report and print a summary.",
    )
    .argument("<days...>", "day files in time order, or a directory of them (sorted by name)")
    .requiredOption("-s, --schema <path>", "dataset schema (JSON)")
    .option("-c, --config <path>", "training configuration (JSON); defaults otherwise")
    .requiredOption("-o, --out <path>", "HTML report to write (written atomically)")
    .option("--window-days <n>", "day files per scored window", parsePositiveInteger, 1)
    .option(
      "--fit-days <n>",
      "first day files the frozen trees and heads are fit on (default: one window)",
      parsePositiveInteger,
    )
    .option(
      "--refit-days <n|all>",
      'day files before each window the refit arm learns on; "all" takes every earlier file',
      parseRefitDays,
      "all",
    )
    .option(
      "--drift-from-day <n>",
      "first day file of the drift: the recovery averages windows from it on (default: every window)",
      parsePositiveInteger,
    )
    .option(
      "--psi-threshold <x>",
      "forest leaf PSI at which to recommend refitting the trees",
      parsePositiveNumber,
      0.25,
    )
    .option("--segment-by <column>", "categorical column to break the heads' figures down by")
    .option("--no-baselines", 'skip the "trees only" and "heads on hashed ids only" baselines')
    .option("--title <text>", "page title", "Leafcast freshness report")
    .option("--skip-bad-rows", "skip bad rows instead of stopping at the first")
    .option("-q, --quiet", "no line per window")
    .action(async (days: string[], options: ReportCommandOptions) => {
      const schema = await loadDatasetSchema(options.schema);
      const config = await loadConfigOption(options.config);
      const files = await listDayFiles(days);
      const log = (line: string): void => {
        if (options.quiet !== true) process.stderr.write(`report: ${line}\n`);
      };
      const study = await runFreshnessStudy(files, schema, config, {
        windowDays: options.windowDays,
        fitDays: options.fitDays ?? options.windowDays,
        refitDays: options.refitDays,
        driftFromDay: options.driftFromDay,
        psiThreshold: options.psiThreshold,
        segmentColumn: options.segmentBy ?? null,
        baselines: options.baselines,
        badRows: options.skipBadRows === true ? "skip" : "fail",
        log,
      });
      const input = studyReportInput(study, {
        title: options.title,
        details: [
          { name: "schema", value: options.schema },
          { name: "configuration", value: options.config ?? "defaults" },
        ],
      });
      const bytes = await writeReport(options.out, input);
      process.stdout.write(
        `${summarizeReport(input)}\nwrote ${options.out} (${(bytes / 1024).toFixed(0)} KiB)\n`,
      );
    });
}

function parseRefitDays(text: string): number | "all" {
  return text === "all" ? "all" : parsePositiveInteger(text);
}

function parsePositiveNumber(text: string): number {
  const value = Number(text);
  if (!(text.trim() !== "" && value > 0 && value < Infinity)) {
    throw new InvalidArgumentError(`expected a positive number, found "${text}"`);
  }
  return value;
}
