/**
 * Half-width of the logit range that score histograms cover: logits in [-16, 16],
 * i.e. p from about 1.1e-7 to 1 - 1.1e-7. Scores beyond it share the end bins, which
 * only widens the reported AUC error bound, never breaks it.
 */
export const SCORE_LOGIT_RANGE = 16;

/**
 * The histogram bin of a score given as its logit, among `binCount` equal-width bins
 * over [-16, 16]. A logit scale spends the bins where ranking models put their scores:
 * near 0 and 1 equal steps of p would lump most rows of a rare outcome together.
 * Monotone in the logit, so bin order never contradicts score order.
 *
 * @example
 * scoreHistogramBin(0, 1 << 14); // 8192 (p = 0.5 sits in the middle)
 * scoreHistogramBin(-40, 1 << 14); // 0
 */
export function scoreHistogramBin(logit: number, binCount: number): number {
  const k = Math.floor(((logit + SCORE_LOGIT_RANGE) / (2 * SCORE_LOGIT_RANGE)) * binCount);
  return k < 0 ? 0 : k >= binCount ? binCount - 1 : k;
}
