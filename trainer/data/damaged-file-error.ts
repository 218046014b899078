import { LeafcastError } from "../errors.js";

/**
 * Turns a decoding library's exception about a Parquet or Arrow file into a
 * LeafcastError that names the file and says what is wrong with it, instead of
 * letting a raw library message (or a TypeError from deep inside) escape.
 *
 * @example
 * throw damagedFileError("parquet", "plots.parquet", error);
 * // parquet: file is truncated or damaged: parquet file invalid (footer != PAR1) (plots.parquet)
 */
export function damagedFileError(source: string, file: string, error: unknown): LeafcastError {
  const reason = error instanceof Error ? error.message : String(error);
  const unsupported = /unsupported|not supported/i.test(reason);
  return new LeafcastError(source, [
    unsupported
      ? { code: "unsupported_file", message: `cannot decode this file: ${reason}`, file }
      : { code: "damaged_file", message: `file is truncated or damaged: ${reason}`, file },
  ]);
}
