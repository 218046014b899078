import { checkMetricInputs } from "./check-metric-inputs.js";

/**
 * Brier score: the (weighted) mean squared difference between prediction and 0/1
 * label. 0 is perfect; always predicting 0.5 scores 0.25.
 *
 * @example
 * brierScore(new Float64Array([0.1, 0.9, 0.8, 0.3]), new Uint8Array([0, 1, 1, 0])); // 0.0375
 */
export function brierScore(
  predicted: Float64Array,
  label: Uint8Array,
  weight?: Float64Array,
): number {
  checkMetricInputs("brierScore", predicted, label, weight);
  let sum = 0;
  let total = 0;
  for (let i = 0; i < predicted.length; i++) {
    const w = weight === undefined ? 1 : weight[i];
    const d = predicted[i] - label[i];
    sum += w * d * d;
    total += w;
  }
  return sum / total;
}
