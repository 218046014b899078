import { calibrationErrorOfBins } from "./calibration-error-of-bins.js";
import { checkBinCount } from "./check-bin-count.js";
import { checkMetricInputs } from "./check-metric-inputs.js";
import { reliabilityBinsKernel } from "./reliability-bins.js";

/**
 * Expected calibration error in the form of Guo et al. (2017), the sum over bins of
 * (bin weight / total weight) * |observed - mean prediction|, taken for the
 * positive-class probability: equal-width bins (k/B, (k+1)/B] over p itself (p = 0 in
 * the first bin), each bin's mean p against its observed positive rate, as in the
 * reliability diagram. (Guo et al. bin the top-class confidence max(p, 1 - p) against
 * accuracy; for a rare outcome that mostly grades the easy negatives, so the
 * positive-class form is used here.)
 *
 * @example
 * expectedCalibrationError(new Float64Array([0.1, 0.2, 0.9]), new Uint8Array([0, 1, 1]), 2);
 * // (2/3) * |0.5 - 0.15| + (1/3) * |1 - 0.9| = 0.2666...
 */
export function expectedCalibrationError(
  predicted: Float64Array,
  label: Uint8Array,
  binCount = 10,
  weight?: Float64Array,
): number {
  checkBinCount("expectedCalibrationError", binCount);
  checkMetricInputs("expectedCalibrationError", predicted, label, weight);
  return calibrationErrorOfBins(reliabilityBinsKernel(predicted, label, binCount, weight));
}
