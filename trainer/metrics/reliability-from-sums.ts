import type { ReliabilityBins } from "./reliability-bins.js";

/**
 * Builds a reliability table from per-bin sums (rows, weight, sum of w p, sum of w y),
 * dividing in place: the two sum arrays become the means (NaN for an empty bin).
 *
 * @example
 * const bins = reliabilityFromSums(
 *   Float64Array.of(2, 0), Float64Array.of(2, 0), Float64Array.of(0.3, 0), Float64Array.of(1, 0));
 * // bins.meanPredicted = [0.15, NaN], bins.observedRate = [0.5, NaN]
 */
export function reliabilityFromSums(
  count: Float64Array,
  weight: Float64Array,
  sumPredicted: Float64Array,
  sumObserved: Float64Array,
): ReliabilityBins {
  for (let k = 0; k < count.length; k++) {
    const w = weight[k];
    sumPredicted[k] = w > 0 ? sumPredicted[k] / w : NaN;
    sumObserved[k] = w > 0 ? sumObserved[k] / w : NaN;
  }
  return {
    binCount: count.length,
    count,
    weight,
    meanPredicted: sumPredicted,
    observedRate: sumObserved,
  };
}
