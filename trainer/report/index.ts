// Every public export of the report package, in one place.
export { renderReport } from "./render-report.js";
export { writeReport } from "./write-report.js";
export { summarizeReport } from "./summarize-report.js";
export { checkReportInput } from "./check-report-input.js";
export { recoveryShares, type RecoveryShares } from "./recovery-shares.js";
export {
  FRESHNESS_ARM_LABELS,
  type FreshnessArm,
  type FreshnessFigure,
  type FreshnessRecovery,
  type FreshnessReport,
  type ForestImportance,
  type ForestPsiSeries,
  type HeadReport,
  type LatencyBatch,
  type LatencyPercentiles,
  type LatencyReport,
  type NamedSummary,
  type PruningReport,
  type PruningStep,
  type ReportDetail,
  type ReportInput,
  type ReportReliability,
  type SegmentSummary,
  type SegmentTable,
  type StalenessReport,
  type WindowPsi,
} from "./report-input.js";
