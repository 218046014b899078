import type { WriteSummary, WrittenBatch, WrittenColumn } from "./write-columns.js";
import { writeTextFile } from "./write-text-file.js";

const encoder = new TextEncoder();

/**
 * Streams batches to newline-delimited JSON: one object per line with the
 * columns as keys in declaration order. A missing value is null; numbers are
 * written so that they parse back to the same doubles; labels are 0/1;
 * categories are JSON strings.
 *
 * @example
 * await writeNdjson("plots.ndjson", [{ name: "open", type: "label" }], [
 *   { rowCount: 2, columns: { open: Uint8Array.of(0, 1) } },
 * ]); // {"open":0}\n{"open":1}\n
 */
export async function writeNdjson(
  path: string,
  columns: readonly WrittenColumn[],
  batches: Iterable<WrittenBatch> | AsyncIterable<WrittenBatch>,
): Promise<WriteSummary> {
  const layout = {
    prefixes: columns.map((column, c) =>
      encoder.encode(`${c === 0 ? "{" : ","}${JSON.stringify(column.name)}:`),
    ),
    rowEnd: encoder.encode("}\n"),
    missing: encoder.encode("null"),
    categoryText: (text: string) => JSON.stringify(text),
  };
  return writeTextFile(path, columns, batches, layout, "");
}
