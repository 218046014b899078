import { binaryEntropy } from "./binary-entropy.js";
import { calibrationErrorOfBins } from "./calibration-error-of-bins.js";
import { checkBinCount } from "./check-bin-count.js";
import { checkMetricInputs } from "./check-metric-inputs.js";
import { checkTrainingRate } from "./check-training-rate.js";
import type { OutcomeSummary } from "./outcome-summary.js";
import { reliabilityBinsKernel } from "./reliability-bins.js";
import { rocAucKernel } from "./roc-auc.js";
import { clampProbability } from "./clamp-probability.js";

/** Options of summarizeOutcome. */
export interface SummarizeOptions {
  readonly weight?: Float64Array;
  /** Equal-width bins for the expected calibration error; default 10. */
  readonly eceBins?: number;
}

/**
 * Every headline metric of one outcome head from in-memory arrays, AUC exact. For data
 * larger than memory use MetricAccumulator, which gives the same figures batch by batch.
 *
 * @example
 * const s = summarizeOutcome(new Float64Array([0.1, 0.9, 0.8, 0.3]), new Uint8Array([0, 1, 1, 0]), 0.5);
 * // s.brier = 0.0375, s.auc = 1, s.calibration = 1.05
 */
export function summarizeOutcome(
  predicted: Float64Array,
  label: Uint8Array,
  trainingRate: number,
  options: SummarizeOptions = {},
): OutcomeSummary {
  const { weight, eceBins = 10 } = options;
  checkTrainingRate("summarizeOutcome", trainingRate);
  checkBinCount("summarizeOutcome", eceBins);
  checkMetricInputs("summarizeOutcome", predicted, label, weight);

  // One pass for every sum; AUC needs its own sort.
  let positives = 0;
  let total = 0;
  let sumP = 0;
  let sumY = 0;
  let sumLoss = 0;
  let sumBrier = 0;
  for (let i = 0; i < predicted.length; i++) {
    const w = weight === undefined ? 1 : weight[i];
    const p = predicted[i];
    const y = label[i];
    const pc = clampProbability(p);
    positives += y;
    total += w;
    sumP += w * p;
    sumY += w * y;
    sumLoss += w * (y === 1 ? -Math.log(pc) : -Math.log(1 - pc));
    sumBrier += w * (p - y) * (p - y);
  }
  const logLoss = sumLoss / total;
  return {
    rows: predicted.length,
    positives,
    positiveRate: sumY / total,
    logLoss,
    ne: logLoss / binaryEntropy(trainingRate),
    calibration: sumP / sumY,
    auc: rocAucKernel(predicted, label, weight),
    aucErrorBound: 0,
    brier: sumBrier / total,
    ece: calibrationErrorOfBins(reliabilityBinsKernel(predicted, label, eceBins, weight)),
  };
}
