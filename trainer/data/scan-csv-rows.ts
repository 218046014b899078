import { isUtf8 } from "node:buffer";
import type { BatchBuilder } from "./batch-builder.js";
import { CategoryByteCache } from "./category-byte-cache.js";
import { CategoryDictionary } from "./category-dictionary.js";
import * as C from "./plan-columns.js";

const COMMA = 44;
const QUOTE = 34;
const LF = 10;
const CR = 13;
const MINUS = 45;
const DOT = 46;

/** Exact powers of ten: a mantissa below 2^53 divided by one of these rounds correctly (Clinger 1990). */
const POW10 = Float64Array.from({ length: 23 }, (_, i) => 10 ** i);
/** At most 15 digits keep the mantissa exact in a double. */
const MAX_FAST_DIGITS = 15;
const empty = new Float64Array(0);
const FNV_OFFSET = 0x811c9dc5 | 0;
const FNV_PRIME = 16777619;

/** Field kinds: read past; text path; plain numeric fast path; fast path checked by role; categorical. */
const FIELD_SKIP = 0;
const FIELD_TEXT = 1;
const FIELD_NUMBER = 2;
const FIELD_ROLE_NUMBER = 3;
const FIELD_CATEGORY = 4;

interface Utf8Slicer {
  utf8Slice(start: number, end: number): string;
}

/**
 * The CSV kernel: walks RFC 4180 records in a byte buffer and hands each field
 * of a schema column to the batch builder, without splitting rows into arrays
 * of strings. Plain decimal numbers are parsed from the bytes by hand; anything
 * else (exponents, long mantissas, quotes, missing markers, errors) goes through
 * the builder's text path. Fields of other columns are skipped unread.
 *
 * `row` counts every record after the header, blank lines included (they are
 * skipped but keep numbering in step with the file's lines where no quoted
 * field spans lines).
 *
 * @example
 * const scanner = new CsvRowScanner(builder, fieldSlots, header);
 * let at = scanner.scan(buffer, 0, buffer.length, false); // stops at a cut row or a full batch
 */
export class CsvRowScanner {
  /** Data rows seen so far (1-based number of the last one). */
  row = 0;
  private readonly fieldCount: number;
  /** Per file field, how it is read: one of the FIELD_* constants. */
  private readonly kinds: Uint8Array;
  /** Per file field: the byte cache and dictionary of a categorical field (unused entries for others). */
  private readonly caches: CategoryByteCache[];
  private readonly dictionaries: CategoryDictionary[];

  /** `fieldSlots[i]` is the builder slot of file field i, or -1 when it is read past. */
  constructor(
    private readonly builder: BatchBuilder,
    private readonly fieldSlots: Int32Array,
    private readonly header: readonly string[],
  ) {
    this.fieldCount = fieldSlots.length;
    this.kinds = Uint8Array.from(fieldSlots, (slot) => {
      if (slot < 0) return FIELD_SKIP;
      const cell = builder.slots[slot].cell;
      if (cell === C.CELL_CATEGORY) return FIELD_CATEGORY;
      if (cell === C.CELL_TIME_ISO || builder.numericMarker[slot] === 1) return FIELD_TEXT;
      return cell === C.CELL_NUMBER ? FIELD_NUMBER : FIELD_ROLE_NUMBER;
    });
    const none = new CategoryDictionary();
    this.dictionaries = Array.from(fieldSlots, (slot) =>
      slot < 0 ? none : (builder.slots[slot].dictionary ?? none),
    );
    const noCache = new CategoryByteCache(0);
    this.caches = Array.from(this.kinds, (kind) =>
      kind === FIELD_CATEGORY ? new CategoryByteCache() : noCache,
    );
  }

  /**
   * Never reads past `end`: the bytes after it may be left over from an earlier chunk.
   *
   * Reads whole records from `buf[start, end)` until the batch is full or the
   * bytes run out; returns where the first unread record starts. Unless `eof`,
   * a record cut by `end` is left for the next call (with more bytes).
   */
  scan(buf: Buffer, start: number, end: number, eof: boolean): number {
    const b = this.builder;
    const slots = this.fieldSlots;
    const kinds = this.kinds;
    const fieldCount = this.fieldCount;
    const text = buf as unknown as Utf8Slicer;
    // take() replaces the arrays, and it never runs while scan does.
    const targets = Array.from(slots, (slot) => (slot < 0 ? empty : b.numbers[slot]));
    let p = start;
    while (p < end) {
      if (b.rowCount === b.capacity) return p;
      const rowStart = p;
      const row = b.rowCount;
      let c = buf[p];
      if (c === LF || c === CR) {
        // A blank line: counted, not read.
        if (c === CR && p + 1 === end && !eof) return rowStart;
        p += c === CR && p + 1 < end && buf[p + 1] === LF ? 2 : 1;
        this.row++;
        continue;
      }
      let field = 0;
      let lineEnd = end;
      while (true) {
        const slot = field < fieldCount ? slots[field] : -1;
        const kind = field < fieldCount ? kinds[field] : FIELD_SKIP;
        const q = p;
        if (q < end && buf[q] === QUOTE) {
          let k = q + 1;
          let doubled = false;
          let closed = false;
          while (k < end) {
            if (buf[k] === QUOTE) {
              if (k + 1 === end && !eof) break;
              if (k + 1 < end && buf[k + 1] === QUOTE) {
                doubled = true;
                k += 2;
                continue;
              }
              closed = true;
              break;
            }
            k++;
          }
          if (!closed) {
            if (!eof) {
              b.resetRow();
              return rowStart;
            }
            b.failRow(
              "bad_quote",
              `a quoted field ${this.fieldName(field)}is not closed before the end of the file`,
              this.header[field] ?? null,
            );
            p = end;
            break;
          }
          if (slot >= 0) {
            const inner = text.utf8Slice(q + 1, k);
            textCell(b, slot, buf, q + 1, k, doubled ? inner.replaceAll('""', '"') : inner);
          }
          p = k + 1;
          if (p < end) {
            c = buf[p];
            if (c !== COMMA && c !== LF && c !== CR) {
              b.failRow(
                "bad_quote",
                `a quoted field ${this.fieldName(field)}has text after its closing quote`,
                this.header[field] ?? null,
              );
              while (p < end && (c = buf[p]) !== COMMA && c !== LF && c !== CR) p++;
              if (p === end && !eof) {
                // The junk runs into the next chunk: read the row again with more bytes.
                b.resetRow();
                return rowStart;
              }
            }
          }
        } else if (kind === FIELD_NUMBER || kind === FIELD_ROLE_NUMBER) {
          let k = q;
          let negative = false;
          c = k < end ? buf[k] : -1;
          if (c === MINUS) {
            negative = true;
            k++;
          }
          let mantissa = 0;
          let digits = 0;
          let d = 0;
          while (k < end && (d = buf[k] - 48) >>> 0 <= 9) {
            mantissa = mantissa * 10 + d;
            digits++;
            k++;
          }
          let fraction = 0;
          if (k < end && buf[k] === DOT) {
            k++;
            while (k < end && (d = buf[k] - 48) >>> 0 <= 9) {
              mantissa = mantissa * 10 + d;
              fraction++;
              k++;
            }
          }
          c = k < end ? buf[k] : -1;
          const total = digits + fraction;
          if (
            (c === COMMA || c === LF || c === CR || c === -1) &&
            total > 0 &&
            total <= MAX_FAST_DIGITS
          ) {
            if (c === -1 && !eof) {
              b.resetRow();
              return rowStart;
            }
            const magnitude = mantissa / POW10[fraction];
            const value = negative ? -magnitude : magnitude;
            if (kind === FIELD_NUMBER) targets[field][row] = value;
            else if (!b.tryNumber(slot, value)) b.textCell(slot, text.utf8Slice(q, k));
          } else {
            // Not a plain decimal (exponent, sign, spaces, marker, long mantissa, error): the text path decides.
            while (k < end && (c = buf[k]) !== COMMA && c !== LF && c !== CR) k++;
            if (k === end && !eof) {
              b.resetRow();
              return rowStart;
            }
            textCell(b, slot, buf, q, k, text.utf8Slice(q, k));
          }
          p = k;
        } else if (kind === FIELD_CATEGORY) {
          // Hash the bytes while looking for the field's end; a cached value needs no string.
          let k = q;
          let hash = FNV_OFFSET;
          while (k < end && (c = buf[k]) !== COMMA && c !== LF && c !== CR) {
            hash = Math.imul(hash ^ c, FNV_PRIME);
            k++;
          }
          if (k === end && !eof) {
            b.resetRow();
            return rowStart;
          }
          const cache = this.caches[field];
          const code = k > q ? cache.find(buf, q, k, hash) : -1;
          if (code >= 0) {
            b.categoryCode(slot, code);
          } else {
            const value = text.utf8Slice(q, k);
            const valid = textCell(b, slot, buf, q, k, value);
            const known =
              valid && k > q && !b.isMissingText(slot, value)
                ? this.dictionaries[field].lookup(value)
                : -1;
            if (known >= 0) cache.add(buf, q, k, hash, known);
          }
          p = k;
        } else {
          let k = q;
          while (k < end && (c = buf[k]) !== COMMA && c !== LF && c !== CR) k++;
          if (k === end && !eof) {
            b.resetRow();
            return rowStart;
          }
          if (slot >= 0) textCell(b, slot, buf, q, k, text.utf8Slice(q, k));
          p = k;
        }
        if (p >= end) break;
        c = buf[p];
        if (c === COMMA) {
          field++;
          p++;
          continue;
        }
        lineEnd = p;
        if (c === CR) {
          if (p + 1 === end && !eof) {
            b.resetRow();
            return rowStart;
          }
          p += p + 1 < end && buf[p + 1] === LF ? 2 : 1;
        } else {
          p++;
        }
        break;
      }
      this.row++;
      if (field + 1 !== fieldCount) {
        const found = field + 1;
        const absent = found < fieldCount ? this.header[found] : undefined;
        b.failRow(
          "ragged_row",
          absent === undefined
            ? `expected ${fieldCount} fields as in the header, found ${found}`
            : `expected ${fieldCount} fields as in the header, found ${found} (column "${absent}" and later are absent)`,
          absent ?? null,
        );
      }
      if (b.rowBad) b.rejectRow(this.row, text.utf8Slice(rowStart, Math.min(lineEnd, p)));
      else b.commitRow();
    }
    return p;
  }

  private fieldName(field: number): string {
    const name = this.header[field];
    return name === undefined ? "" : `(column "${name}") `;
  }
}

/**
 * Hands a field's text to the builder unless its bytes `buf[from, to)` are not
 * UTF-8: decoding turns any broken sequence into U+FFFD, so two different
 * broken category values would otherwise silently become one. Returns whether
 * the text was handed over. Only texts holding U+FFFD pay for the check.
 */
function textCell(
  b: BatchBuilder,
  slot: number,
  buf: Buffer,
  from: number,
  to: number,
  value: string,
): boolean {
  if (value.includes("\uFFFD") && !isUtf8(buf.subarray(from, to))) {
    b.invalidText(slot, value);
    return false;
  }
  b.textCell(slot, value);
  return true;
}
