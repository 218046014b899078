/**
 * The largest magnitude a standardized numeric input takes: (x - mean) / std is
 * clipped to [-STANDARDIZED_LIMIT, STANDARDIZED_LIMIT]. No real value lies a
 * million standard deviations out, and the bound lets the loader prove that no
 * logit can overflow (checkScoringModel multiplies numeric weights by it), so a
 * hostile item of 1e308 gives a saturated probability, never NaN.
 */
export const STANDARDIZED_LIMIT = 1e6;

/**
 * A standardized numeric input, clipped; the encoder and the scorer both call it,
 * so training and serving see the same number.
 *
 * @example
 * clipStandardized(1e308, 2, 3); // 1000000
 */
export function clipStandardized(x: number, mean: number, std: number): number {
  const v = (x - mean) / std;
  return v > STANDARDIZED_LIMIT
    ? STANDARDIZED_LIMIT
    : v < -STANDARDIZED_LIMIT
      ? -STANDARDIZED_LIMIT
      : v;
}
