import type { WrittenColumn, WrittenValues } from "./write-columns.js";
import { writeIntegerText, writeNumberText } from "./write-number-text.js";

/** How a text format lays out a row; CSV and NDJSON differ only in these bytes. */
export interface TextRowLayout {
  /** Bytes before each column's cell: CSV "," (none for the first), NDJSON `,"name":`. */
  readonly prefixes: readonly Uint8Array[];
  /** Bytes that end a row: CSV "\n", NDJSON "}\n". */
  readonly rowEnd: Uint8Array;
  /** A missing cell: CSV nothing, NDJSON "null". */
  readonly missing: Uint8Array;
  /** The cell text of a category value, quoted or escaped as the format needs. */
  readonly categoryText: (text: string) => string;
}

/** A layout resolved against the columns of one file, built once per file. */
export interface TextRowPlan {
  readonly kinds: Uint8Array;
  readonly decimals: Int8Array;
  /** All prefixes back to back; column c's is prefixBytes[prefixStart[c] .. prefixStart[c + 1]). */
  readonly prefixBytes: Uint8Array;
  readonly prefixStart: Int32Array;
  readonly rowEnd: Uint8Array;
  readonly missing: Uint8Array;
  /**
   * Per category column, every category's cell as `categoryStride[c]` int32
   * words: the byte length, then the bytes packed little-endian (zero
   * padded). The kernel copies whole words, so a cell is a fixed number of
   * 4-byte stores from one place in memory instead of a byte loop with an
   * unpredictable end and a separate table of offsets.
   */
  readonly categoryWords: readonly Int32Array[];
  readonly categoryStride: Int32Array;
  /** An upper bound on the bytes of one row. */
  readonly maxRowBytes: number;
}

const KIND_FLOAT = 0;
const KIND_INT = 1;
const KIND_LABEL = 2;
const KIND_CATEGORY = 3;
const KIND_OF = { float64: KIND_FLOAT, int: KIND_INT, label: KIND_LABEL, category: KIND_CATEGORY };
/** Longest `String(v)` of a double, e.g. "-2.2250738585072014e-308", plus slack. */
const MAX_NUMBER_BYTES = 25;

/**
 * Resolves a text layout for `columns`: encodes every category text once, so
 * rows are assembled from ready bytes.
 *
 * @example
 * const plan = planTextRows(columns, csvLayout);
 */
export function planTextRows(
  columns: readonly WrittenColumn[],
  layout: TextRowLayout,
): TextRowPlan {
  let maxRowBytes = layout.rowEnd.length;
  const categoryWords: Int32Array[] = [];
  const categoryStride = new Int32Array(columns.length);
  columns.forEach((column, c) => {
    const texts = column.type === "category" ? column.categories.map(layout.categoryText) : [];
    const { flat, start, widest } = encodeTexts(texts);
    const stride = 1 + Math.ceil(widest / 4);
    const words = new Int32Array(texts.length * stride);
    for (let t = 0; t < texts.length; t++) {
      words[t * stride] = start[t + 1] - start[t];
      for (let b = start[t]; b < start[t + 1]; b++) {
        const shift = ((b - start[t]) & 3) * 8;
        words[t * stride + 1 + ((b - start[t]) >> 2)] |= flat[b] << shift;
      }
    }
    categoryWords.push(words);
    categoryStride[c] = stride;
    // A category cell stores whole words, so budget them, not just the text.
    const cell =
      column.type === "category"
        ? 4 * (stride - 1)
        : column.type === "label"
          ? 1
          : MAX_NUMBER_BYTES;
    maxRowBytes += layout.prefixes[c].length + Math.max(cell, layout.missing.length);
  });
  const prefixStart = new Int32Array(columns.length + 1);
  layout.prefixes.forEach((prefix, c) => (prefixStart[c + 1] = prefixStart[c] + prefix.length));
  const prefixBytes = new Uint8Array(prefixStart[columns.length]);
  layout.prefixes.forEach((prefix, c) => prefixBytes.set(prefix, prefixStart[c]));
  return {
    kinds: Uint8Array.from(columns, (column) => KIND_OF[column.type]),
    decimals: Int8Array.from(columns, (column) =>
      column.type === "float64" ? (column.decimals ?? -1) : 0,
    ),
    prefixBytes,
    prefixStart,
    rowEnd: layout.rowEnd,
    missing: layout.missing,
    categoryWords,
    categoryStride,
    maxRowBytes,
  };
}

/**
 * Kernel: writes rows [0, rowCount) of `values` (one array per planned column,
 * already checked) into `out` and returns the byte count. `out` must hold
 * `rowCount * plan.maxRowBytes` bytes.
 *
 * @example
 * const out = new Uint8Array(rowCount * plan.maxRowBytes);
 * const n = writeTextRows(plan, values, rowCount, out);
 */
export function writeTextRows(
  plan: TextRowPlan,
  values: readonly WrittenValues[],
  rowCount: number,
  out: Uint8Array,
): number {
  const { kinds, decimals, prefixBytes, prefixStart, rowEnd, missing } = plan;
  const { categoryWords, categoryStride } = plan;
  const view = new DataView(out.buffer, out.byteOffset, out.byteLength);
  const columnCount = kinds.length;
  let pos = 0;
  for (let r = 0; r < rowCount; r++) {
    for (let c = 0; c < columnCount; c++) {
      const prefixEnd = prefixStart[c + 1];
      for (let i = prefixStart[c]; i < prefixEnd; i++) out[pos++] = prefixBytes[i];
      const kind = kinds[c];
      if (kind === KIND_FLOAT) {
        const v = (values[c] as Float64Array)[r];
        if (v === v) {
          pos = writeNumberText(out, pos, v, decimals[c]);
        } else {
          for (let i = 0; i < missing.length; i++) out[pos++] = missing[i];
        }
      } else if (kind === KIND_LABEL) {
        out[pos++] = 48 + (values[c] as Uint8Array)[r];
      } else if (kind === KIND_INT) {
        const v = (values[c] as Int32Array)[r];
        // Most counts are one or two digits: write those inline.
        if (v >= 0 && v < 100) {
          if (v >= 10) {
            const tens = (v / 10) | 0;
            out[pos++] = 48 + tens;
            out[pos++] = 48 + v - tens * 10;
          } else {
            out[pos++] = 48 + v;
          }
        } else {
          pos = writeIntegerText(out, pos, v);
        }
      } else {
        const code = (values[c] as Int32Array)[r];
        if (code >= 0) {
          const words = categoryWords[c];
          const stride = categoryStride[c];
          const at = code * stride;
          for (let w = 1; w < stride; w++) view.setInt32(pos + 4 * w - 4, words[at + w], true);
          pos += words[at];
        } else {
          for (let i = 0; i < missing.length; i++) out[pos++] = missing[i];
        }
      }
    }
    for (let i = 0; i < rowEnd.length; i++) out[pos++] = rowEnd[i];
  }
  return pos;
}

/**
 * UTF-8 bytes of `texts` back to back, and where each starts. Vocabularies
 * are mostly ASCII ids (50,000 viewers): copying char codes straight into one
 * buffer is an order of magnitude faster than a TextEncoder call per text,
 * which cost about 0.1 s a file; other texts go through encodeInto.
 */
function encodeTexts(texts: readonly string[]): {
  flat: Uint8Array;
  start: Int32Array;
  widest: number;
} {
  const encoder = new TextEncoder();
  const start = new Int32Array(texts.length + 1);
  let widest = 0;
  let ascii = true;
  for (let t = 0; t < texts.length; t++) {
    const text = texts[t];
    let length = text.length;
    for (let i = 0; i < text.length; i++) {
      if (text.charCodeAt(i) >= 128) {
        ascii = false;
        length = encoder.encode(text).length;
        break;
      }
    }
    widest = Math.max(widest, length);
    start[t + 1] = start[t] + length;
  }
  const flat = new Uint8Array(start[texts.length]);
  for (let t = 0; t < texts.length; t++) {
    const text = texts[t];
    let pos = start[t];
    if (ascii || pos + text.length === start[t + 1]) {
      for (let i = 0; i < text.length; i++) flat[pos++] = text.charCodeAt(i);
    } else {
      encoder.encodeInto(text, flat.subarray(pos, start[t + 1]));
    }
  }
  return { flat, start, widest };
}
