/**
 * Predictions are clamped to [PROBABILITY_EPSILON, 1 - PROBABILITY_EPSILON] before a
 * logarithm is taken, so a confident wrong prediction costs about 34.5 nats instead of
 * infinity (common practice; the same bound as older scikit-learn releases).
 */
export const PROBABILITY_EPSILON = 1e-15;

/**
 * `p` clamped to [1e-15, 1 - 1e-15].
 *
 * @example
 * clampProbability(0); // 1e-15
 * clampProbability(0.3); // 0.3
 */
export function clampProbability(p: number): number {
  return p < PROBABILITY_EPSILON
    ? PROBABILITY_EPSILON
    : p > 1 - PROBABILITY_EPSILON
      ? 1 - PROBABILITY_EPSILON
      : p;
}
