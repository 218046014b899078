import { SeededRandom } from "./seeded-random.js";

/**
 * Marks the rows held out for early stopping: round(fraction * n) rows, at most
 * n - 1. With timestamps, the latest rows (a model is judged on the future it
 * will serve; rows without a time count as earliest, and among equal times the
 * later rows in file order go first); otherwise a seeded uniform draw.
 * Returns null when nothing is held out.
 *
 * @example
 * chooseValidationRows(10, 0.2, Float64Array.of(5, 1, 2, 9, 3, 4, 6, 7, 8, 0), 1);
 * // marks rows 3 (time 9) and 8 (time 8)
 */
export function chooseValidationRows(
  n: number,
  fraction: number,
  timestamps: Float64Array | null,
  seed: number,
): Uint8Array | null {
  const k = Math.min(n - 1, Math.round(fraction * n));
  if (k <= 0) return null;
  const mask = new Uint8Array(n);
  if (timestamps !== null) {
    const times = new Float64Array(n);
    for (let r = 0; r < n; r++) {
      const t = timestamps[r];
      times[r] = t === t ? t : -Infinity;
    }
    const cutoff = Float64Array.from(times).sort()[n - k];
    let taken = 0;
    for (let r = 0; r < n; r++) {
      if (times[r] > cutoff) {
        mask[r] = 1;
        taken++;
      }
    }
    for (let r = n - 1; r >= 0 && taken < k; r--) {
      if (times[r] === cutoff) {
        mask[r] = 1;
        taken++;
      }
    }
    return mask;
  }
  const random = new SeededRandom(seed).fork(2);
  let taken = 0;
  for (let r = 0; r < n && taken < k; r++) {
    if (random.nextFloat() * (n - r) < k - taken) {
      mask[r] = 1;
      taken++;
    }
  }
  return mask;
}
