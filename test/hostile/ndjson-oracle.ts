// An independent NDJSON reading of a file's bytes: split on LF (one CR before it
// is dropped), an optional UTF-8 BOM at the very start, JSON.parse per line, and
// the rules readNdjson documents: blank lines (JSON whitespace only) are skipped
// but counted; a line that is not UTF-8, not JSON or not an object is a bad row;
// the first object's keys decide the file's columns (a required column absent
// refuses the file); a key absent from a later object is a missing cell.
import { columnsRefused, jsonVerdict, readColumns, type CellValue } from "./fuzz-schema.js";
import { strictUtf8, type OracleRead, type OracleRow } from "./oracle-types.js";

const LF = 0x0a;
const CR = 0x0d;

/** The oracle's reading of an NDJSON file against the fuzz schema. */
export function ndjsonOracle(bytes: Uint8Array): OracleRead {
  const start = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? 3 : 0;
  const rows: OracleRow[] = [];
  let columns: string[] | null = null;
  let sawLine = false;
  let line = 0;
  let p = start;
  while (p < bytes.length) {
    let end = bytes.indexOf(LF, p);
    if (end < 0) end = bytes.length;
    line++;
    let stop = end;
    if (stop > p && bytes[stop - 1] === CR) stop--;
    const piece = bytes.subarray(p, stop);
    p = end + 1;
    if (piece.every((b) => b === 0x20 || b === 0x09 || b === CR)) continue;
    sawLine = true;
    const text = strictUtf8(piece);
    let record: unknown;
    try {
      record = text === null ? undefined : JSON.parse(text);
    } catch {
      record = undefined;
    }
    if (typeof record !== "object" || record === null || Array.isArray(record)) {
      rows.push({ row: line, values: null });
      continue;
    }
    if (columns === null) {
      const keys = Object.keys(record);
      if (columnsRefused(keys)) return { columns: [], rows, fileError: true };
      columns = readColumns(keys);
    }
    rows.push({ row: line, values: cellValues(record, columns) });
  }
  if (columns === null && !sawLine) return { columns: [], rows, fileError: true };
  return { columns: columns ?? [], rows, fileError: false };
}

function cellValues(record: object, columns: readonly string[]): CellValue[] | null {
  const values: CellValue[] = [];
  for (const column of columns) {
    const value: unknown = Object.prototype.hasOwnProperty.call(record, column)
      ? (record as Record<string, unknown>)[column]
      : undefined;
    const verdict = jsonVerdict(column, value);
    if (!verdict.ok) return null;
    values.push(verdict.value);
  }
  return values;
}
