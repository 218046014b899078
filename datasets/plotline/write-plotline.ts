import type { DataFormat, WriteSummary } from "../../trainer/data/write-columns.js";
import { writeDataFile } from "../../trainer/data/write-data-file.js";
import { generatesOnWorker, plotlineChunksAhead } from "./plotline-chunks-ahead.js";
import { plotlineColumns } from "./plotline-columns.js";
import { resolvePlotlineOptions, type PlotlineOptions } from "./plotline-options.js";

/**
 * Text files do not show chunk boundaries, so CSV and NDJSON generated on the
 * writing thread come in chunks this small: a chunk's 39 columns (about 0.4 MB
 * at 2,048 rows) then stay in the caches between being generated and being read
 * row by row for formatting (8,192 rows was about 15 % faster than 65,536 here,
 * and 2,048 about 5 % faster again; 1,024 was no better).
 */
const TEXT_CHUNK_ROWS = 2048;

/**
 * Chunks generated on a worker cross cores anyway; this size spares messages and
 * kept CSV writing fastest (16,384 rows beat 32,768 and 65,536 by 2-15 %).
 */
export const WORKER_TEXT_CHUNK_ROWS = 16_384;

/**
 * Generates the Plotline log and streams it to `path` in `format`; the file
 * appears only when complete. Memory stays at a few chunks, so any number
 * of rows can be written. Parquet gets one row group, Arrow one record batch
 * per `chunkRows` rows. Read it with datasets/plotline.schema.json.
 *
 * @example
 * await writePlotline("runs/plotline.parquet", "parquet", { seed: 7, rowsPerDay: 20_000 });
 */
export function writePlotline(
  path: string,
  format: DataFormat,
  options: PlotlineOptions = {},
): Promise<WriteSummary> {
  const resolved = resolvePlotlineOptions(options);
  const text = format === "csv" || format === "ndjson";
  const textRows = generatesOnWorker(options) ? WORKER_TEXT_CHUNK_ROWS : TEXT_CHUNK_ROWS;
  const chunkRows = text ? Math.min(textRows, resolved.chunkRows) : resolved.chunkRows;
  return writeDataFile(
    path,
    format,
    plotlineColumns(resolved),
    plotlineChunksAhead({ ...options, chunkRows }),
  );
}
