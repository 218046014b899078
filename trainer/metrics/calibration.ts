import { checkMetricInputs } from "./check-metric-inputs.js";

/**
 * Calibration as He et al. (2014) report it: the (weighted) mean prediction over the
 * observed positive rate, i.e. expected positives over observed positives. 1 is
 * perfect, above 1 over-predicts; Infinity when there are no positives.
 *
 * @example
 * calibration(new Float64Array([0.1, 0.9, 0.8, 0.3]), new Uint8Array([0, 1, 1, 0])); // 1.05
 */
export function calibration(
  predicted: Float64Array,
  label: Uint8Array,
  weight?: Float64Array,
): number {
  checkMetricInputs("calibration", predicted, label, weight);
  let expected = 0;
  let observed = 0;
  for (let i = 0; i < predicted.length; i++) {
    const w = weight === undefined ? 1 : weight[i];
    expected += w * predicted[i];
    observed += w * label[i];
  }
  return expected / observed;
}
