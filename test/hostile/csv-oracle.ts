// An independent CSV reading of a file's bytes, kept deliberately plain: a
// record-at-a-time RFC 4180 parse (quoted fields, doubled quotes, CRLF, LF or a
// lone CR ending a record, an optional UTF-8 BOM at the very start), plus the
// dialect choices openDataFile documents: blank lines are skipped but counted,
// a field count unlike the header's, a quote left open, or text after a
// closing quote makes the row bad; a header with such problems, or not UTF-8,
// refuses the file.
import { columnsRefused, readColumns, textVerdict, type CellValue } from "./fuzz-schema.js";
import { strictUtf8, type OracleRead, type OracleRow } from "./oracle-types.js";

const QUOTE = 0x22;
const COMMA = 0x2c;
const LF = 0x0a;
const CR = 0x0d;

interface Record_ {
  fields: Uint8Array[];
  malformed: boolean;
  next: number;
}

/** Parses one record starting at `p` (which is not a line end). */
function parseRecord(bytes: Uint8Array, p: number): Record_ {
  const n = bytes.length;
  const fields: Uint8Array[] = [];
  let malformed = false;
  while (true) {
    if (p < n && bytes[p] === QUOTE) {
      const out: number[] = [];
      let k = p + 1;
      let closed = false;
      while (k < n) {
        if (bytes[k] === QUOTE) {
          if (bytes[k + 1] === QUOTE) {
            out.push(QUOTE);
            k += 2;
            continue;
          }
          closed = true;
          break;
        }
        out.push(bytes[k]);
        k++;
      }
      fields.push(Uint8Array.from(out));
      if (!closed) return { fields, malformed: true, next: n };
      p = k + 1;
      if (p < n && bytes[p] !== COMMA && bytes[p] !== LF && bytes[p] !== CR) {
        malformed = true;
        while (p < n && bytes[p] !== COMMA && bytes[p] !== LF && bytes[p] !== CR) p++;
      }
    } else {
      let k = p;
      while (k < n && bytes[k] !== COMMA && bytes[k] !== LF && bytes[k] !== CR) k++;
      fields.push(bytes.subarray(p, k));
      p = k;
    }
    if (p >= n) return { fields, malformed, next: n };
    if (bytes[p] === COMMA) {
      p++;
      continue;
    }
    const next = bytes[p] === CR && bytes[p + 1] === LF ? p + 2 : p + 1;
    return { fields, malformed, next };
  }
}

/** The oracle's reading of a CSV file against the fuzz schema. */
export function csvOracle(bytes: Uint8Array): OracleRead {
  const refused: OracleRead = { columns: [], rows: [], fileError: true };
  let p = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? 3 : 0;
  if (p >= bytes.length) return refused;
  const header = parseRecord(bytes, p);
  if (header.malformed) return refused;
  const names: string[] = [];
  for (const field of header.fields) {
    const name = strictUtf8(field);
    if (name === null) return refused;
    names.push(name);
  }
  if (names.length === 1 && names[0] === "") return refused;
  if (columnsRefused(names)) return refused;
  const columns = readColumns(names);
  const positions = columns.map((c) => names.indexOf(c));
  const rows: OracleRow[] = [];
  let row = 0;
  p = header.next;
  while (p < bytes.length) {
    row++;
    if (bytes[p] === LF || bytes[p] === CR) {
      p += bytes[p] === CR && bytes[p + 1] === LF ? 2 : 1;
      continue;
    }
    const record = parseRecord(bytes, p);
    p = record.next;
    rows.push({ row, values: recordValues(record, names.length, columns, positions) });
  }
  return { columns, rows, fileError: false };
}

function recordValues(
  record: Record_,
  width: number,
  columns: readonly string[],
  positions: readonly number[],
): CellValue[] | null {
  if (record.malformed || record.fields.length !== width) return null;
  const values: CellValue[] = [];
  for (let i = 0; i < columns.length; i++) {
    const text = strictUtf8(record.fields[positions[i]]);
    if (text === null) return null;
    const verdict = textVerdict(columns[i], text);
    if (!verdict.ok) return null;
    values.push(verdict.value);
  }
  return values;
}
