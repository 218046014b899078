import type { WriteSummary, WrittenBatch, WrittenColumn } from "./write-columns.js";
import { writeTextFile } from "./write-text-file.js";

const encoder = new TextEncoder();

/**
 * Streams batches to a CSV file (RFC 4180: comma separated, "\n" line ends,
 * fields quoted only when they hold a comma, quote or line break). A missing
 * value is an empty cell; numbers are written so that they parse back to the
 * same doubles; labels are 0/1; categories are their texts.
 *
 * @example
 * await writeCsv("plots.csv", [{ name: "open", type: "label" }], [
 *   { rowCount: 2, columns: { open: Uint8Array.of(0, 1) } },
 * ]);
 */
export async function writeCsv(
  path: string,
  columns: readonly WrittenColumn[],
  batches: Iterable<WrittenBatch> | AsyncIterable<WrittenBatch>,
): Promise<WriteSummary> {
  const layout = {
    prefixes: columns.map((_, c) => encoder.encode(c === 0 ? "" : ",")),
    rowEnd: encoder.encode("\n"),
    missing: new Uint8Array(0),
    categoryText: csvField,
  };
  const header = columns.map((column) => csvField(column.name)).join(",") + "\n";
  return writeTextFile(path, columns, batches, layout, header);
}

/** Quotes a field when it must be quoted, doubling inner quotes. */
function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}
