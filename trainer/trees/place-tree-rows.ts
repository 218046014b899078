import type { SeededRandom } from "./seeded-random.js";
import type { TrainingBuffers } from "./training-buffers.js";

/**
 * Puts one tree's rows in buffers.rows: all training rows, or a seeded
 * rowFraction of them (selection sampling, so they stay ascending). fitOneForest
 * calls it only for a row sample: the gradient round places all rows itself.
 * Every row's score is updated by traversal afterwards, sampled or not (see
 * gradientRound). Returns the number of the tree's rows.
 *
 * @example
 * const rootCount = placeTreeRows(buffers, trainRows, 0.8, random.fork(t));
 */
export function placeTreeRows(
  buffers: TrainingBuffers,
  trainRows: Uint32Array,
  fraction: number,
  random: SeededRandom,
): number {
  const rows = buffers.rows;
  if (fraction >= 1) {
    rows.set(trainRows);
    return trainRows.length;
  }
  const n = trainRows.length;
  const k = Math.max(1, Math.round(fraction * n));
  let taken = 0;
  for (let i = 0; i < n; i++) {
    if (taken < k && random.nextFloat() * (n - i) < k - taken) rows[taken++] = trainRows[i];
  }
  return taken;
}
