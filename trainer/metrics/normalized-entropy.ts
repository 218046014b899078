import { binaryEntropy } from "./binary-entropy.js";
import { checkMetricInputs } from "./check-metric-inputs.js";
import { checkTrainingRate } from "./check-training-rate.js";
import { logLossKernel } from "./log-loss.js";

/**
 * Normalized entropy (He et al. 2014): mean log loss divided by the entropy of the
 * training data's average empirical positive rate, NE = logLoss / H(trainingRate).
 * Below 1 means better than always predicting the training rate. The training rate is
 * an argument because it comes from the training data, not from the rows scored here.
 *
 * @example
 * normalizedEntropy(new Float64Array([0.9, 0.1, 0.2, 0.65]), new Uint8Array([1, 0, 0, 1]), 0.5);
 * // 0.21616187468057912 / Math.log(2) = 0.3118557...
 */
export function normalizedEntropy(
  predicted: Float64Array,
  label: Uint8Array,
  trainingRate: number,
  weight?: Float64Array,
): number {
  checkTrainingRate("normalizedEntropy", trainingRate);
  checkMetricInputs("normalizedEntropy", predicted, label, weight);
  return logLossKernel(predicted, label, weight) / binaryEntropy(trainingRate);
}
