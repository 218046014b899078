import { checkMetricInputs } from "./check-metric-inputs.js";
import { clampProbability } from "./clamp-probability.js";

/**
 * Mean log loss (cross-entropy, natural log) of predictions against 0/1 labels,
 * weighted when `weight` is given: sum w_i l_i / sum w_i with
 * l_i = -(y_i ln p_i + (1 - y_i) ln(1 - p_i)). Predictions are clamped to
 * [1e-15, 1 - 1e-15] first (see clampProbability).
 *
 * @example
 * logLoss(new Float64Array([0.9, 0.1, 0.2, 0.65]), new Uint8Array([1, 0, 0, 1]));
 * // 0.21616187468057912
 */
export function logLoss(predicted: Float64Array, label: Uint8Array, weight?: Float64Array): number {
  checkMetricInputs("logLoss", predicted, label, weight);
  return logLossKernel(predicted, label, weight);
}

/** Trusts its input: equal lengths, p in [0, 1], labels 0/1, a positive weight total. */
export function logLossKernel(
  predicted: Float64Array,
  label: Uint8Array,
  weight?: Float64Array,
): number {
  const n = predicted.length;
  let loss = 0;
  let total = 0;
  for (let i = 0; i < n; i++) {
    const p = clampProbability(predicted[i]);
    const l = label[i] === 1 ? -Math.log(p) : -Math.log(1 - p);
    const w = weight === undefined ? 1 : weight[i];
    loss += w * l;
    total += w;
  }
  return loss / total;
}
