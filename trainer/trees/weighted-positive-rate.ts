/**
 * The weighted share of positive labels among the rows not flagged in `exclude`
 * (weights all 1 when `weight` is null); `whenEmpty` when those rows weigh nothing.
 *
 * @example
 * weightedPositiveRate(Uint8Array.of(1, 0, 0, 1), Float64Array.of(1, 1, 1, 3)); // 4 / 6
 */
export function weightedPositiveRate(
  label: Uint8Array,
  weight: Float64Array | null,
  exclude: Uint8Array | null = null,
  whenEmpty = 0,
): number {
  let positive = 0;
  let total = 0;
  for (let r = 0; r < label.length; r++) {
    if (exclude !== null && exclude[r] === 1) continue;
    const w = weight === null ? 1 : weight[r];
    positive += w * label[r];
    total += w;
  }
  return total > 0 ? positive / total : whenEmpty;
}
