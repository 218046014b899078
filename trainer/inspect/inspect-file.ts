import { openDataFile, type ReadOptions, type ReadStats } from "../data/open-data-file.js";
import type { ResolvedSchema } from "../schema/load-dataset-schema.js";
import { ColumnSummary, type ColumnSummaryReport } from "./column-summary.js";

/** The result of inspecting one data file against a dataset schema. */
export interface InspectionReport {
  readonly file: string;
  readonly schema: string;
  readonly format: string;
  readonly stats: ReadStats;
  readonly columns: readonly ColumnSummaryReport[];
  readonly seconds: number;
}

/**
 * Reads a whole file through the schema and summarizes every declared column:
 * rows, missing values, ranges, label rates, top categories and bad rows.
 *
 * @example
 * const report = await inspectFile("plotline.csv", schema, { badRows: "skip" });
 * report.columns.find((c) => c.name === "open")?.positiveRate;
 */
export async function inspectFile(
  path: string,
  schema: ResolvedSchema,
  options: ReadOptions & { readonly onRows?: (rows: number) => void } = {},
): Promise<InspectionReport> {
  const started = performance.now();
  const reader = openDataFile(path, schema, options);
  const summaries = new Map<string, ColumnSummary>();
  for (const column of schema.columns) {
    if (column.role !== "ignore")
      summaries.set(column.name, new ColumnSummary(column.name, column.role));
  }
  let rows = 0;
  for await (const batch of reader.batches()) {
    for (const [name, column] of batch.columns) summaries.get(name)?.add(column);
    rows += batch.rowCount;
    options.onRows?.(rows);
  }
  const columns = [...summaries.values()].map((summary) => summary.report());
  return {
    file: path,
    schema: schema.name,
    format: reader.format,
    stats: reader.stats,
    columns,
    seconds: (performance.now() - started) / 1000,
  };
}
