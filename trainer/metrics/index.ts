// Every public export of the metrics package, in one place.
export { binaryEntropy } from "./binary-entropy.js";
export { brierScore } from "./brier-score.js";
export { calibration } from "./calibration.js";
export { calibrationErrorOfBins } from "./calibration-error-of-bins.js";
export { PROBABILITY_EPSILON, clampProbability } from "./clamp-probability.js";
export { expectedCalibrationError } from "./expected-calibration-error.js";
export { histogramAuc, type HistogramAuc } from "./histogram-auc.js";
export { leafPsi, type LeafPsi } from "./leaf-psi.js";
export { logLoss } from "./log-loss.js";
export {
  MetricAccumulator,
  type GroupMetrics,
  type MetricAccumulatorOptions,
  type MetricColumns,
  type SegmentMetrics,
  type SliceMetrics,
} from "./metric-accumulator.js";
export { normalizedEntropy } from "./normalized-entropy.js";
export type { OutcomeSummary } from "./outcome-summary.js";
export {
  PSI_EPSILON,
  populationStabilityIndex,
  type BinCounts,
} from "./population-stability-index.js";
export { psiReading, type PsiReading } from "./psi-reading.js";
export { reliabilityBins, type ReliabilityBins } from "./reliability-bins.js";
export { rocAuc } from "./roc-auc.js";
export { sortIndexByKey } from "./sort-index-by-key.js";
export { staleness, type StalenessVerdict } from "./staleness.js";
export { summarizeOutcome, type SummarizeOptions } from "./summarize-outcome.js";
