/**
 * A forest's starting log-odds: the logit of the weighted positive rate of the
 * rows not flagged in `exclude` (the validation rows). The rate is clamped to
 * [1e-6, 1 - 1e-6] so that a single-class label starts from a finite score
 * (about -13.8 or +13.8) instead of -Infinity or +Infinity.
 *
 * @example
 * baseLogit(Uint8Array.of(1, 0, 0, 0), null, null); // log(1 / 3) = -1.0986...
 */
export function baseLogit(
  label: Uint8Array,
  weight: Float64Array | null,
  exclude: Uint8Array | null,
): number {
  let positive = 0;
  let total = 0;
  for (let r = 0; r < label.length; r++) {
    if (exclude !== null && exclude[r] === 1) continue;
    const w = weight === null ? 1 : weight[r];
    positive += w * label[r];
    total += w;
  }
  const rate = Math.min(1 - RATE_FLOOR, Math.max(RATE_FLOOR, total > 0 ? positive / total : 0.5));
  return Math.log(rate / (1 - rate));
}

const RATE_FLOOR = 1e-6;
