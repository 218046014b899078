/**
 * Maps a probability learned on data whose negatives were kept at `rate` back to
 * the probability on unsampled data (He et al. 2014): q = p / (p + (1 - p) / rate).
 * In log-odds it is a shift, logit(q) = logit(p) + ln(rate), which is how the
 * training kernel applies it.
 *
 * @example
 * recalibrate(0.0909918, 0.01); // 0.001: a 0.1 % rate seen as 9.10 % after keeping 1 % of negatives
 */
export function recalibrate(p: number, rate: number): number {
  return p / (p + (1 - p) / rate);
}
