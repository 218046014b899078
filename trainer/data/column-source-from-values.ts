import type { ColumnSource } from "./feed-column-rows.js";
import { CELL_CATEGORY } from "./plan-columns.js";

const none: ColumnSource = {
  numbers: null,
  values: null,
  indices: null,
  texts: null,
  codeMap: null,
  valid: null,
  epochMs: false,
  booleans: false,
};

/**
 * Turns decoded values of one type (with nulls) into the typed form the bulk
 * copy reads: numbers, booleans as 0/1, Dates as epoch milliseconds, bigints as
 * numbers, and text (or, for a categorical column, any of these as its decimal
 * text) as indices into the distinct values. A column that mixes types, or
 * holds anything else, stays as it is and is read row by row.
 *
 * @example
 * columnSourceFromValues(["kale", null, "kale"], CELL_CATEGORY, null);
 * // { indices: Int32Array [0, 0, 0], texts: ["kale"], valid: Uint8Array [1, 0, 1], ... }
 */
export function columnSourceFromValues(
  values: ArrayLike<unknown>,
  cell: number,
  valid: Uint8Array | null,
): ColumnSource {
  const n = values.length;
  let type: string | null = null;
  let nulls = 0;
  for (let i = 0; i < n; i++) {
    const v = values[i];
    if (v === null || v === undefined || (valid !== null && valid[i] === 0)) {
      nulls++;
      continue;
    }
    const t = v instanceof Date ? "date" : typeof v;
    if (type === null) type = t;
    else if (t !== type) return { ...none, values, valid };
  }
  let mask = valid;
  if (nulls > 0 && mask === null) {
    mask = new Uint8Array(n);
    for (let i = 0; i < n; i++) mask[i] = values[i] === null || values[i] === undefined ? 0 : 1;
  }
  const asText = cell === CELL_CATEGORY && (type === "number" || type === "bigint");
  if (type === "string" || asText) return indexed(values, mask);
  if (type === "number" || type === "bigint" || type === "date" || type === "boolean") {
    const numbers = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      if (mask !== null && mask[i] === 0) continue;
      const v = values[i] as number | bigint | boolean | Date;
      numbers[i] = v instanceof Date ? v.getTime() : Number(v);
    }
    return {
      ...none,
      numbers,
      valid: mask,
      epochMs: type === "date",
      booleans: type === "boolean",
    };
  }
  if (type === null) return { ...none, numbers: new Float64Array(n), valid: mask };
  return { ...none, values, valid };
}

/** Distinct texts and per-row indices into them. */
function indexed(values: ArrayLike<unknown>, mask: Uint8Array | null): ColumnSource {
  const n = values.length;
  const indices = new Int32Array(n);
  const texts: string[] = [];
  const seen = new Map<string, number>();
  for (let i = 0; i < n; i++) {
    if (mask !== null && mask[i] === 0) continue;
    const text = String(values[i]);
    let index = seen.get(text);
    if (index === undefined) {
      index = texts.length;
      texts.push(text);
      seen.set(text, index);
    }
    indices[i] = index;
  }
  return { ...none, indices, texts, codeMap: new Int32Array(texts.length).fill(-1), valid: mask };
}
