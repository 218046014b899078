/** Histogram slots per column: every column gets 256 (its value bins, its missing bin, then unused). */
export const COLUMN_SLOTS = 256;

/**
 * Adds rows[start .. end) to a histogram of gradient sum, hessian sum and count,
 * interleaved per bin: column c, bin b at 3 (256 c + b). The gradient and hessian
 * of the row at position i are ordered[2i] and ordered[2i + 1]: they travel with
 * the row indexes through partitions ("ordered gradients"), so only the bins are
 * read at scattered rows. In a deep node whose rows are 10 % of all, that made
 * the histogram about twice as fast in a probe here. A fixed stride per
 * column turns each slot address into shifts and adds, with no per-column offset
 * table to load (about 25 % faster in a probe here); the per-column loop is
 * unrolled by four over row-major bins (performance-notes.md). Rows are summed in
 * the order given, so a block of rows always sums the same way, whoever runs it.
 * Kernel: no checks, no allocation.
 *
 * @example
 * // 2 rows x 1 column: bins 1 and 2.
 * const hist = new Float64Array(3 * 256);
 * accumulateHistogram(Uint8Array.of(1, 2), 1, Uint32Array.of(0, 1), 0, 2,
 *   Float64Array.of(0.5, 0.25, -0.5, 0.25), hist);
 * // hist[3 .. 9) = [0.5, 0.25, 1, -0.5, 0.25, 1]
 */
export function accumulateHistogram(
  bins: Uint8Array,
  columnCount: number,
  rows: Uint32Array,
  start: number,
  end: number,
  ordered: Float64Array,
  hist: Float64Array,
): void {
  const unrolled = columnCount & ~3;
  for (let i = start; i < end; i++) {
    const r = rows[i];
    const g = ordered[2 * i];
    const h = ordered[2 * i + 1];
    const at = r * columnCount;
    let c = 0;
    for (; c < unrolled; c += 4) {
      const q = at + c;
      const o = c * 768;
      const k0 = o + bins[q] * 3;
      const k1 = o + 768 + bins[q + 1] * 3;
      const k2 = o + 1536 + bins[q + 2] * 3;
      const k3 = o + 2304 + bins[q + 3] * 3;
      hist[k0] += g;
      hist[k0 + 1] += h;
      hist[k0 + 2] += 1;
      hist[k1] += g;
      hist[k1 + 1] += h;
      hist[k1 + 2] += 1;
      hist[k2] += g;
      hist[k2 + 1] += h;
      hist[k2 + 2] += 1;
      hist[k3] += g;
      hist[k3 + 1] += h;
      hist[k3 + 2] += 1;
    }
    for (; c < columnCount; c++) {
      const k = c * 768 + bins[at + c] * 3;
      hist[k] += g;
      hist[k + 1] += h;
      hist[k + 2] += 1;
    }
  }
}
