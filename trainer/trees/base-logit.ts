import { weightedPositiveRate } from "./weighted-positive-rate.js";

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
  const observed = weightedPositiveRate(label, weight, exclude, 0.5);
  const rate = Math.min(1 - RATE_FLOOR, Math.max(RATE_FLOOR, observed));
  return Math.log(rate / (1 - rate));
}

const RATE_FLOOR = 1e-6;
