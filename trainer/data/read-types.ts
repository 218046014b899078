import type { ResolvedSchema } from "../schema/load-dataset-schema.js";
import type { CategoryDictionary } from "./category-dictionary.js";
import type { ColumnBatch } from "./column-batch.js";
import type { DataFormat } from "./detect-data-format.js";
import type { RejectSink } from "./reject-sink.js";

/** How to read a data file; every field has a default. */
export interface ReadOptions {
  /** Rows per batch (the last batch may hold fewer). Default 65536. */
  batchRows?: number;
  /**
   * What a bad row does. "fail" (default): the read throws a LeafcastError naming
   * file, row, column and reason. "skip": the row is left out of the batches,
   * counted by code in the stats, and written to `rejectsPath` when given.
   */
  badRows?: "fail" | "skip";
  /**
   * With badRows "skip": where rejected rows go, one JSON object a line
   * ({file, row, column, code, reason, raw}), written to a temporary file and
   * renamed into place once the read ends. Always written (perhaps empty) when the
   * read completes; never left half-written when it fails or is abandoned.
   */
  rejectsPath?: string;
  /** Default: from the extension (.csv .ndjson/.jsonl .parquet .arrow/.arrows/.feather/.ipc). */
  format?: DataFormat;
  /** Share categorical codes across several files: pass the same map to each read. */
  dictionaries?: Map<string, CategoryDictionary>;
  /** Stops the read; the iteration then rejects with the signal's reason. */
  signal?: AbortSignal;
  /** Bytes per read from the file for CSV and NDJSON. Default 1 MiB; tests use tiny values to cut rows across chunks. */
  chunkBytes?: number;
  /**
   * CSV and NDJSON: the longest record (a CSV header or row, an NDJSON line) in
   * bytes. A longer one is a file-level error, fatal under either bad-row policy:
   * the reader must hold a whole record, so without a bound a file with no line
   * breaks would grow the buffer until the process dies. Default 64 MiB (a row of
   * a million columns of a few bytes each fits).
   */
  maxRecordBytes?: number;
}

/** What a read did. Live while the read runs; final once iteration ends. */
export interface ReadStats {
  readonly file: string;
  readonly rowsAccepted: number;
  readonly rowsRejected: number;
  /** Where rejected rows were written, once that file is in place; null otherwise. */
  readonly rejectsPath: string | null;
  /** Rejected rows by issue code, e.g. { not_a_number: 3, ragged_row: 1 }. */
  readonly rejectedByCode: Readonly<Record<string, number>>;
}

/** The writable form of ReadStats, kept by the read itself. */
export interface MutableReadStats {
  file: string;
  rowsAccepted: number;
  rowsRejected: number;
  rejectsPath: string | null;
  rejectedByCode: Record<string, number>;
}

/** An opened data file. Nothing is read until `batches()` is iterated. */
export interface DataFileReader {
  readonly format: DataFormat;
  readonly stats: ReadStats;
  /** The file's accepted rows in batches of `batchRows`; may be iterated once. */
  batches(): AsyncIterable<ColumnBatch>;
}

/** One rejected row, as written to the rejects file. */
export interface RejectRecord {
  readonly file: string;
  /** 1-based data row (see each reader for how rows are counted). */
  readonly row: number;
  readonly column: string | null;
  readonly code: string;
  readonly reason: string;
  /** The row as found: the CSV record or NDJSON line, or the row's values as JSON. */
  readonly raw: string;
}

/** What every format reader gets from openDataFile. */
export interface ReadContext {
  readonly file: string;
  readonly schema: ResolvedSchema;
  readonly batchRows: number;
  readonly chunkBytes: number;
  readonly maxRecordBytes: number;
  readonly signal: AbortSignal | undefined;
  readonly sink: RejectSink;
  readonly dictionaries: Map<string, CategoryDictionary> | undefined;
}
