import type { DataFormat, WriteSummary, WrittenBatch, WrittenColumn } from "./write-columns.js";
import { writeArrow } from "./write-arrow.js";
import { writeCsv } from "./write-csv.js";
import { writeNdjson } from "./write-ndjson.js";
import { writeParquet } from "./write-parquet.js";

/**
 * Streams column batches to a data file in any of the four formats. The file
 * appears only when complete (temporary name, flush, rename). Batches may come
 * from a generator, so a file of any size is written in bounded memory.
 *
 * @example
 * const columns = [
 *   { name: "tie_strength", type: "float64", decimals: 3 },
 *   { name: "post_type", type: "category", categories: ["tip", "question"] },
 *   { name: "open", type: "label" },
 * ] as const;
 * await writeDataFile("plots.parquet", "parquet", columns, [{
 *   rowCount: 2,
 *   columns: {
 *     tie_strength: Float64Array.of(0.25, NaN),
 *     post_type: Int32Array.of(1, 0),
 *     open: Uint8Array.of(0, 1),
 *   },
 * }]);
 */
export function writeDataFile(
  path: string,
  format: DataFormat,
  columns: readonly WrittenColumn[],
  batches: Iterable<WrittenBatch> | AsyncIterable<WrittenBatch>,
): Promise<WriteSummary> {
  switch (format) {
    case "csv":
      return writeCsv(path, columns, batches);
    case "ndjson":
      return writeNdjson(path, columns, batches);
    case "parquet":
      return writeParquet(path, columns, batches);
    case "arrow":
      return writeArrow(path, columns, batches);
  }
}
