import { clampProbability } from "./clamp-probability.js";
import type { PreparedRows } from "./group-stats-table.js";
import { reliabilityBinIndex } from "./reliability-bin-index.js";

/**
 * Computes once per batch what every grouping of a MetricAccumulator needs per row:
 * the log loss (p clamped to [1e-15, 1 - 1e-15]), the reliability bin and the logit
 * that score histograms bin. Both logarithms serve the loss and the logit.
 *
 * @example
 * const rows = prepareRows(Float64Array.of(0.5), Uint8Array.of(1), undefined, 10);
 * // rows.loss = [ln 2], rows.reliabilityBin = [4], rows.logit = [0]
 */
export function prepareRows(
  predicted: Float64Array,
  label: Uint8Array,
  weight: Float64Array | undefined,
  reliabilityBins: number,
): PreparedRows {
  const n = predicted.length;
  const loss = new Float64Array(n);
  const reliabilityBin = new Int32Array(n);
  const logit = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const p = clampProbability(predicted[i]);
    const lnP = Math.log(p);
    const lnQ = Math.log(1 - p);
    loss[i] = label[i] === 1 ? -lnP : -lnQ;
    reliabilityBin[i] = reliabilityBinIndex(predicted[i], reliabilityBins);
    logit[i] = lnP - lnQ;
  }
  return { length: n, predicted, label, weight, loss, reliabilityBin, logit };
}
