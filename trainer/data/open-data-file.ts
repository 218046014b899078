import { LeafcastError } from "../errors.js";
import type { ResolvedSchema } from "../schema/load-dataset-schema.js";
import type { ColumnBatch } from "./column-batch.js";
import { detectDataFormat, type DataFormat } from "./detect-data-format.js";
import { readArrow } from "./read-arrow.js";
import { readCsv } from "./read-csv.js";
import { readNdjson } from "./read-ndjson.js";
import { readParquet } from "./read-parquet.js";
import type {
  DataFileReader,
  MutableReadStats,
  ReadContext,
  ReadOptions,
  ReadStats,
} from "./read-types.js";
import { RejectSink } from "./reject-sink.js";
import { RejectsWriter } from "./rejects-writer.js";

export type { DataFormat } from "./detect-data-format.js";
export type { DataFileReader, ReadOptions, ReadStats, RejectRecord } from "./read-types.js";

const readers: Record<DataFormat, (ctx: ReadContext) => AsyncGenerator<ColumnBatch>> = {
  csv: readCsv,
  ndjson: readNdjson,
  parquet: readParquet,
  arrow: readArrow,
};

/**
 * Opens a CSV, NDJSON, Parquet or Arrow IPC file for reading against a dataset
 * schema. Every format yields the same column batches of `batchRows` rows, and
 * memory stays bounded by the batch size (Parquet: by the row group; Arrow: by
 * the record batch), so a file larger than memory streams through.
 *
 * Rows are 1-based data rows: a CSV header is not counted; CSV blank lines and
 * NDJSON lines are counted, so an NDJSON row number is its line number. Cells
 * are checked by their column's role (see BatchBuilder); a required schema
 * column missing from the file, an empty file, a CSV or NDJSON record longer
 * than `maxRecordBytes` and a damaged Parquet or Arrow file are file-level
 * errors, fatal under either bad-row policy.
 *
 * @example
 * const reader = openDataFile("plots.csv", schema, { badRows: "skip", rejectsPath: "rejects.ndjson" });
 * for await (const batch of reader.batches()) train(batch);
 * reader.stats; // { file: "plots.csv", rowsAccepted: 9998, rowsRejected: 2, rejectsPath: "rejects.ndjson", rejectedByCode: { not_a_number: 2 } }
 */
export function openDataFile(
  path: string,
  schema: ResolvedSchema,
  options: ReadOptions = {},
): DataFileReader {
  const format = options.format ?? detectDataFormat(path);
  const batchRows = options.batchRows ?? 65536;
  const chunkBytes = options.chunkBytes ?? 1 << 20;
  const maxRecordBytes = options.maxRecordBytes ?? 1 << 26;
  const badRows = options.badRows ?? "fail";
  checkOptions(path, format, batchRows, chunkBytes, maxRecordBytes, badRows, options.rejectsPath);
  const stats: MutableReadStats = {
    file: path,
    rowsAccepted: 0,
    rowsRejected: 0,
    rejectsPath: null,
    rejectedByCode: {},
  };
  let started = false;

  async function* run(): AsyncGenerator<ColumnBatch> {
    const writer =
      options.rejectsPath === undefined ? null : await RejectsWriter.open(options.rejectsPath);
    const sink = new RejectSink(format, path, badRows, stats, writer);
    const ctx: ReadContext = {
      file: path,
      schema,
      batchRows,
      chunkBytes,
      maxRecordBytes,
      signal: options.signal,
      sink,
      dictionaries: options.dictionaries,
    };
    let finished = false;
    try {
      options.signal?.throwIfAborted();
      for await (const batch of readers[format](ctx)) {
        stats.rowsAccepted += batch.rowCount;
        yield batch;
        options.signal?.throwIfAborted();
      }
      await sink.finish();
      finished = true;
    } catch (error) {
      throw unreadable(format, path, error);
    } finally {
      if (!finished) await sink.abandon();
    }
  }

  return {
    format,
    stats: stats as ReadStats,
    batches(): AsyncIterable<ColumnBatch> {
      if (started) throw new Error(`data: the batches of ${path} can be iterated only once`);
      started = true;
      return run();
    },
  };
}

/** A file-system error on the data file (no such file, no permission) as a LeafcastError naming it. */
function unreadable(source: string, path: string, error: unknown): unknown {
  const system = error as { code?: unknown; syscall?: unknown; path?: unknown; message?: unknown };
  if (typeof system?.code !== "string" || system.path !== path) return error;
  return new LeafcastError(source, [
    { code: "unreadable", message: `cannot read file: ${String(system.message)}`, file: path },
  ]);
}

function checkOptions(
  path: string,
  format: string,
  batchRows: number,
  chunkBytes: number,
  maxRecordBytes: number,
  badRows: string,
  rejectsPath: string | undefined,
): void {
  const problems: string[] = [];
  if (!(format in readers))
    problems.push(`format expected csv, ndjson, parquet or arrow, found ${JSON.stringify(format)}`);
  if (!Number.isSafeInteger(batchRows) || batchRows < 1)
    problems.push(`batchRows expected a whole number >= 1, found ${batchRows}`);
  if (!Number.isSafeInteger(chunkBytes) || chunkBytes < 1)
    problems.push(`chunkBytes expected a whole number >= 1, found ${chunkBytes}`);
  if (!Number.isSafeInteger(maxRecordBytes) || maxRecordBytes < 1)
    problems.push(`maxRecordBytes expected a whole number >= 1, found ${maxRecordBytes}`);
  if (badRows !== "fail" && badRows !== "skip")
    problems.push(`badRows expected "fail" or "skip", found ${JSON.stringify(badRows)}`);
  if (rejectsPath !== undefined && badRows !== "skip")
    problems.push(`rejectsPath expected badRows "skip", found badRows "${badRows}"`);
  if (problems.length > 0) {
    throw new LeafcastError(
      "data",
      problems.map((message) => ({ code: "bad_option", message, file: path })),
    );
  }
}
