/**
 * Writes the bin of every value of one numeric column into column `column` of a
 * row-major bin matrix: the first b with x <= edges[b], or `missingBin` for NaN.
 * Values are finite or NaN. `edges` (the last one the largest finite number) is
 * padded to 256 entries with +Infinity (see padEdges), so the search is
 * eight fixed halvings whose comparisons become arithmetic instead of branches:
 * raw values arrive in no order, and a branchy search mispredicts about every
 * other step (five times slower in a probe here). Kernel: no checks, no allocation.
 *
 * @example
 * const out = new Uint8Array(3);
 * binNumericColumn(Float64Array.of(0.5, NaN, 9), padEdges(Float64Array.of(1, Number.MAX_VALUE)), out, 1, 0, 2);
 * // out = [0, 2, 1]
 */
export function binNumericColumn(
  values: Float64Array,
  edges: Float64Array,
  out: Uint8Array,
  stride: number,
  column: number,
  missingBin: number,
): void {
  const n = values.length;
  for (let r = 0, at = column; r < n; r++, at += stride) {
    const x = values[r];
    if (x !== x) {
      out[at] = missingBin;
      continue;
    }
    let b = +(x > edges[127]) << 7;
    b += +(x > edges[b + 63]) << 6;
    b += +(x > edges[b + 31]) << 5;
    b += +(x > edges[b + 15]) << 4;
    b += +(x > edges[b + 7]) << 3;
    b += +(x > edges[b + 3]) << 2;
    b += +(x > edges[b + 1]) << 1;
    b += +(x > edges[b]);
    out[at] = b;
  }
}

/**
 * Bin edges (at most 255) padded to 256 entries with +Infinity, the form
 * binNumericColumn searches.
 *
 * @example
 * padEdges(Float64Array.of(1, Number.MAX_VALUE)).length; // 256
 */
export function padEdges(edges: Float64Array): Float64Array {
  const padded = new Float64Array(256).fill(Infinity);
  padded.set(edges);
  return padded;
}

/**
 * Writes the bins of one categorical column: `binOfCode[code]` for a code the trees
 * know, `missingBin` for code -1, a code beyond the table or a table entry of -1.
 * Kernel.
 *
 * @example
 * const out = new Uint8Array(3);
 * binCategoryColumn(Int32Array.of(4, -1, 2), Int32Array.of(-1, -1, 1, -1, 0), out, 1, 0, 2);
 * // out = [0, 2, 1]
 */
export function binCategoryColumn(
  codes: Int32Array,
  binOfCode: Int32Array,
  out: Uint8Array,
  stride: number,
  column: number,
  missingBin: number,
): void {
  const n = codes.length;
  const known = binOfCode.length;
  for (let r = 0, at = column; r < n; r++, at += stride) {
    const code = codes[r];
    const bin = code >= 0 && code < known ? binOfCode[code] : -1;
    out[at] = bin >= 0 ? bin : missingBin;
  }
}
