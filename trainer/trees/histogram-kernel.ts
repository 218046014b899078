/** Histogram slots per column: every column gets 256 (its value bins, its missing bin, then unused). */
export const COLUMN_SLOTS = 256;

/**
 * Adds positions start .. end - 1 to a histogram of gradient sum, hessian sum and
 * count, interleaved per bin: column c, bin b at 3 (256 c + b). Position i's bins
 * are placed[i * stride + c] and its gradient and hessian ordered[2i] and
 * ordered[2i + 1]: both travel with the rows through partitions (see
 * partitionRows), so a node's histogram reads memory sequentially however deep
 * the node is. A fixed stride per column turns each slot address into shifts
 * and adds, with no per-column offset table to load (about 25 % faster in a
 * probe here); the per-column loop is unrolled by four over row-major bins
 * (performance-notes.md). Positions are summed in order, so a block of rows
 * always sums the same way, whoever runs it. Kernel: no checks, no allocation.
 *
 * @example
 * // 2 rows x 1 column (stride 4): bins 1 and 2.
 * const hist = new Float64Array(3 * 256);
 * accumulateHistogram(Uint8Array.of(1, 0, 0, 0, 2, 0, 0, 0), 4, 1, 0, 2,
 *   Float64Array.of(0.5, 0.25, -0.5, 0.25), hist);
 * // hist[3 .. 9) = [0.5, 0.25, 1, -0.5, 0.25, 1]
 */
export function accumulateHistogram(
  placed: Uint8Array,
  stride: number,
  columnCount: number,
  start: number,
  end: number,
  ordered: Float64Array,
  hist: Float64Array,
): void {
  const unrolled = columnCount & ~3;
  for (let i = start; i < end; i++) {
    const g = ordered[2 * i];
    const h = ordered[2 * i + 1];
    const at = i * stride;
    let c = 0;
    for (; c < unrolled; c += 4) {
      const q = at + c;
      const o = c * 768;
      const k0 = o + placed[q] * 3;
      const k1 = o + 768 + placed[q + 1] * 3;
      const k2 = o + 1536 + placed[q + 2] * 3;
      const k3 = o + 2304 + placed[q + 3] * 3;
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
      const k = c * 768 + placed[at + c] * 3;
      hist[k] += g;
      hist[k + 1] += h;
      hist[k + 2] += 1;
    }
  }
}
