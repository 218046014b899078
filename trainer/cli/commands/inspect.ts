import type { Command } from "commander";
import { inspectFile, type InspectionReport } from "../../inspect/inspect-file.js";
import { loadDatasetSchema } from "../../schema/load-dataset-schema.js";
import { ProgressLine } from "../progress-line.js";
import { parsePositiveInteger } from "../parse-options.js";

interface InspectOptions {
  readonly schema: string;
  readonly skipBadRows?: boolean;
  readonly rejects?: string;
  readonly json?: boolean;
  readonly batchRows: number;
}

/** `leafcast inspect FILE --schema S`: reads a log against its schema and summarizes it. */
export function registerInspectCommand(program: Command): void {
  program
    .command("inspect")
    .description(
      "Read a data file against a dataset schema: rows, per-column summary, label rates, bad rows.",
    )
    .argument("<file>", "data file (.csv, .ndjson, .parquet, .arrow)")
    .requiredOption("-s, --schema <path>", "dataset schema (JSON)")
    .option("--skip-bad-rows", "count and set aside bad rows instead of stopping at the first")
    .option("--rejects <path>", "with --skip-bad-rows: write the bad rows here (NDJSON)")
    .option("--batch-rows <n>", "rows per batch", parsePositiveInteger, 65536)
    .option("--json", "print one JSON document instead of a table")
    .action(async (file: string, options: InspectOptions) => {
      const schema = await loadDatasetSchema(options.schema);
      const progress = new ProgressLine(`inspect ${file}`, "rows");
      const report = await inspectFile(file, schema, {
        batchRows: options.batchRows,
        badRows: options.skipBadRows === true ? "skip" : "fail",
        rejectsPath: options.rejects,
        onRows: (rows) => progress.update(rows),
      });
      progress.finish();
      process.stdout.write(
        options.json === true ? `${JSON.stringify(report, null, 2)}\n` : renderInspection(report),
      );
    });
}

/** The human-readable form of an inspection report. */
export function renderInspection(report: InspectionReport): string {
  const { stats } = report;
  const lines = [
    `${report.file} (${report.format}) against schema "${report.schema}"`,
    `rows: ${stats.rowsAccepted} accepted, ${stats.rowsRejected} rejected` +
      (stats.rejectsPath !== null && stats.rowsRejected > 0
        ? ` (written to ${stats.rejectsPath})`
        : "") +
      ` in ${report.seconds.toFixed(2)} s`,
  ];
  for (const [code, count] of Object.entries(stats.rejectedByCode))
    lines.push(`  rejected ${code}: ${count}`);
  lines.push("");
  const table: string[][] = [["column", "role", "missing", "summary"]];
  for (const c of report.columns) {
    let summary = "";
    if (c.rows === 0) summary = "(not in file)";
    else if (c.positiveRate !== undefined)
      summary = `positive rate ${(100 * c.positiveRate).toFixed(3)} % (${c.positives})`;
    else if (c.top !== undefined) {
      summary = `${c.distinct} distinct; top ${c.top.map((t) => `${t.value} (${t.rows})`).join(", ")}`;
    } else if (c.mean !== undefined)
      summary = `min ${fmt(c.min)}, mean ${fmt(c.mean)}, max ${fmt(c.max)}`;
    else if (c.min !== undefined) summary = `${c.min} .. ${c.max}`;
    table.push([c.name, c.role, String(c.missing), summary]);
  }
  const widths = [0, 1, 2].map((i) => Math.max(...table.map((row) => row[i].length)));
  for (const row of table) {
    lines.push(
      `${row[0].padEnd(widths[0])}  ${row[1].padEnd(widths[1])}  ${row[2].padStart(widths[2])}  ${row[3]}`,
    );
  }
  return `${lines.join("\n")}\n`;
}

function fmt(value: number | string | undefined): string {
  if (typeof value !== "number") return String(value);
  return String(Number(value.toPrecision(4)));
}
