/**
 * Binary entropy in nats, H(p) = -(p ln p + (1 - p) ln(1 - p)): the log loss of
 * always predicting the rate p on data whose positive rate is p. H(0) = H(1) = 0.
 *
 * @example
 * binaryEntropy(0.5); // 0.6931471805599453 (ln 2)
 */
export function binaryEntropy(p: number): number {
  if (!(p >= 0 && p <= 1)) {
    throw new RangeError(`binaryEntropy: expected a probability in [0, 1], found ${p}`);
  }
  if (p === 0 || p === 1) return 0;
  return -(p * Math.log(p) + (1 - p) * Math.log(1 - p));
}
