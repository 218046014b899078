import { LeafcastError } from "../errors.js";

/**
 * The file-level error of a text reader whose record (a CSV header or row, an
 * NDJSON line) outgrew `maxRecordBytes` before it ended: the reader must hold a
 * whole record, so it stops rather than grow its buffer without bound.
 *
 * @example
 * throw recordTooLongError("csv", "plots.csv", 1 << 26, 18); // csv: expected a record of at most 67108864 bytes, found a longer one (plots.csv row 18)
 */
export function recordTooLongError(
  source: string,
  file: string,
  maxRecordBytes: number,
  row: number | null,
): LeafcastError {
  const what = source === "ndjson" ? "line" : row === null ? "header" : "record";
  const message = `expected a ${what} of at most ${maxRecordBytes} bytes, found a longer one`;
  return new LeafcastError(source, [
    row === null
      ? { code: "record_too_long", message, file }
      : { code: "record_too_long", message, file, row },
  ]);
}
