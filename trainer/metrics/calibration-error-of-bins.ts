import type { ReliabilityBins } from "./reliability-bins.js";

/**
 * Expected calibration error of a reliability table: sum over bins of
 * (bin weight / total weight) * |observed rate - mean prediction|; empty bins add
 * nothing. NaN when every bin is empty.
 *
 * @example
 * calibrationErrorOfBins(reliabilityBins(new Float64Array([0.1, 0.2, 0.9]), new Uint8Array([0, 1, 1]), 2));
 * // (2/3) * |0.5 - 0.15| + (1/3) * |1 - 0.9| = 0.2666...
 */
export function calibrationErrorOfBins(bins: ReliabilityBins): number {
  let total = 0;
  let gap = 0;
  for (let k = 0; k < bins.binCount; k++) {
    const w = bins.weight[k];
    if (!(w > 0)) continue;
    total += w;
    gap += w * Math.abs(bins.observedRate[k] - bins.meanPredicted[k]);
  }
  return total > 0 ? gap / total : NaN;
}
