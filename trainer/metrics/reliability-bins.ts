import { checkBinCount } from "./check-bin-count.js";
import { checkMetricInputs } from "./check-metric-inputs.js";
import { reliabilityBinIndex } from "./reliability-bin-index.js";
import { reliabilityFromSums } from "./reliability-from-sums.js";

/**
 * A reliability table over equal-width bins (k/B, (k+1)/B] of the prediction (the
 * bin of p = 0 is the first): per bin the rows, their total weight, the weighted mean
 * prediction and the weighted observed positive rate (NaN for an empty bin).
 */
export interface ReliabilityBins {
  readonly binCount: number;
  readonly count: Float64Array;
  readonly weight: Float64Array;
  readonly meanPredicted: Float64Array;
  readonly observedRate: Float64Array;
}

/**
 * Bins predictions for a reliability diagram; a calibrated model has meanPredicted
 * close to observedRate in every bin.
 *
 * @example
 * const bins = reliabilityBins(new Float64Array([0.1, 0.2, 0.9]), new Uint8Array([0, 1, 1]), 2);
 * // bins.count = [2, 1], bins.meanPredicted = [0.15, 0.9], bins.observedRate = [0.5, 1]
 */
export function reliabilityBins(
  predicted: Float64Array,
  label: Uint8Array,
  binCount = 10,
  weight?: Float64Array,
): ReliabilityBins {
  checkBinCount("reliabilityBins", binCount);
  checkMetricInputs("reliabilityBins", predicted, label, weight);
  return reliabilityBinsKernel(predicted, label, binCount, weight);
}

/** Trusts its input (see checkMetricInputs and checkBinCount). */
export function reliabilityBinsKernel(
  predicted: Float64Array,
  label: Uint8Array,
  binCount: number,
  weight?: Float64Array,
): ReliabilityBins {
  const count = new Float64Array(binCount);
  const binWeight = new Float64Array(binCount);
  const sumPredicted = new Float64Array(binCount);
  const sumObserved = new Float64Array(binCount);
  for (let i = 0; i < predicted.length; i++) {
    const k = reliabilityBinIndex(predicted[i], binCount);
    const w = weight === undefined ? 1 : weight[i];
    count[k] += 1;
    binWeight[k] += w;
    sumPredicted[k] += w * predicted[i];
    sumObserved[k] += w * label[i];
  }
  return reliabilityFromSums(count, binWeight, sumPredicted, sumObserved);
}
