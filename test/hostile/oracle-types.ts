import type { CellValue } from "./fuzz-schema.js";

/** One data row as the oracle sees it: its 1-based number and its values in column order, or null when bad. */
export interface OracleRow {
  readonly row: number;
  readonly values: readonly CellValue[] | null;
}

/**
 * What a correct reader must make of a file: the rows in order (blank lines
 * are not rows but are counted in the numbering), and whether the file is
 * refused as a whole after those rows (a bad header, a required column absent).
 */
export interface OracleRead {
  readonly columns: readonly string[];
  readonly rows: readonly OracleRow[];
  readonly fileError: boolean;
}

/** A strict UTF-8 decode: null when the bytes are not UTF-8 (WHATWG decoder in fatal mode). */
export function strictUtf8(bytes: Uint8Array): string | null {
  try {
    return new TextDecoder("utf-8", { fatal: true, ignoreBOM: true }).decode(bytes);
  } catch {
    return null;
  }
}

/** The oracle's reading of a JSON file: strict UTF-8, one leading BOM allowed, else undefined. */
export function parseStrictly(bytes: Uint8Array): unknown {
  const text = strictUtf8(bytes);
  if (text === null) return undefined;
  try {
    return JSON.parse(text.startsWith("\ufeff") ? text.slice(1) : text) as unknown;
  } catch {
    return undefined;
  }
}
