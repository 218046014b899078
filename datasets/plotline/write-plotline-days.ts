import { join } from "node:path";
import type {
  DataFormat,
  WriteSummary,
  WrittenBatch,
  WrittenValues,
} from "../../trainer/data/write-columns.js";
import { writeDataFile } from "../../trainer/data/write-data-file.js";
import type { PlotlineChunk } from "./generate-plotline.js";
import { plotlineChunksAhead } from "./plotline-chunks-ahead.js";
import { WORKER_TEXT_CHUNK_ROWS } from "./write-plotline.js";
import { plotlineColumns } from "./plotline-columns.js";
import { resolvePlotlineOptions, type PlotlineOptions } from "./plotline-options.js";

const SECONDS_PER_DAY = 86_400;

/** The file name of day `day` (1-based), e.g. "day-07.csv". */
export function plotlineDayFileName(day: number, format: DataFormat, days: number): string {
  const extension = format === "arrow" ? "arrow" : format;
  return `day-${String(day).padStart(Math.max(2, String(days).length), "0")}.${extension}`;
}

/**
 * Generates the Plotline log once and writes one file per day into `dir`, the
 * way logs usually land: the update step can then take "the next day's file".
 * The rows are exactly those of `writePlotline` with the same options.
 *
 * @example
 * const files = await writePlotlineDays("runs/plotline", "csv", { days: 14, rowsPerDay: 20_000 });
 * files[0].path; // "runs/plotline/day-01.csv"
 */
export async function writePlotlineDays(
  dir: string,
  format: DataFormat,
  options: PlotlineOptions = {},
  onDay?: (summary: WriteSummary, day: number) => void,
): Promise<WriteSummary[]> {
  const resolved = resolvePlotlineOptions(options);
  const columns = plotlineColumns(resolved);
  // Days split chunks by time, so the chunk size changes no file; text formats take smaller ones.
  const text = format === "csv" || format === "ndjson";
  const chunkRows = text
    ? Math.min(WORKER_TEXT_CHUNK_ROWS, resolved.chunkRows)
    : resolved.chunkRows;
  const chunks = plotlineChunksAhead({ ...options, chunkRows });
  let pending: PlotlineChunk | null = null;
  const summaries: WriteSummary[] = [];
  try {
    for (let day = 0; day < resolved.days; day++) {
      const dayEnd = resolved.startSeconds + (day + 1) * SECONDS_PER_DAY;
      const last = day === resolved.days - 1;
      // Rows are in time order, so a day is a run of whole chunks plus the head of the next one.
      async function* rowsOfDay(): AsyncGenerator<WrittenBatch> {
        while (true) {
          if (pending === null) {
            const next = await chunks.next();
            if (next.done === true) return;
            pending = next.value;
          }
          const chunk: PlotlineChunk = pending;
          const cut = last
            ? chunk.rowCount
            : firstRowAtOrAfter(chunk.columns.timestamp, chunk.rowCount, dayEnd);
          if (cut === chunk.rowCount) {
            pending = null;
            yield chunk;
            continue;
          }
          if (cut > 0) yield sliceBatch(chunk, 0, cut);
          pending = {
            ...chunk,
            rowCount: chunk.rowCount - cut,
            columns: sliceColumns(chunk.columns, cut, chunk.rowCount),
          };
          return;
        }
      }
      const path = join(dir, plotlineDayFileName(day + 1, format, resolved.days));
      const summary = await writeDataFile(path, format, columns, rowsOfDay());
      summaries.push(summary);
      onDay?.(summary, day + 1);
    }
  } finally {
    // Stops the generator's worker when a write failed half way.
    await chunks.return(undefined);
  }
  return summaries;
}

function firstRowAtOrAfter(timestamps: Float64Array, rowCount: number, limit: number): number {
  let lo = 0;
  let hi = rowCount;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (timestamps[mid] < limit) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

function sliceBatch(chunk: PlotlineChunk, from: number, to: number): WrittenBatch {
  return { rowCount: to - from, columns: sliceColumns(chunk.columns, from, to) };
}

function sliceColumns<T extends Readonly<Record<string, WrittenValues>>>(
  columns: T,
  from: number,
  to: number,
): T {
  const out: Record<string, WrittenValues> = {};
  for (const [name, values] of Object.entries(columns)) out[name] = values.subarray(from, to);
  return out as T;
}
