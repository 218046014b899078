// Every public export of the study package (the freshness study and tree staleness), in one place.
export { ArmAccumulators } from "./arm-accumulators.js";
export { checkStudyOptions } from "./check-study-options.js";
export { checkTrainingRates } from "./check-training-rates.js";
export { forestHeadModels } from "./forest-head-models.js";
export { forestStaleness } from "./forest-staleness.js";
export { freshnessRecovery } from "./freshness-recovery.js";
export { hybridScorer } from "./hybrid-scorer.js";
export { listDayFiles } from "./list-day-files.js";
export {
  planStudyWindows,
  type StudyPlan,
  type StudyPlanOptions,
  type StudyWindow,
} from "./plan-study-windows.js";
export {
  runFreshnessStudy,
  type FreshnessStudy,
  type FreshnessStudyOptions,
} from "./run-freshness-study.js";
export {
  scoreWindow,
  type LeafCountTarget,
  type ScoreWindowOptions,
  type WindowTarget,
} from "./score-window.js";
export { spanLabel } from "./span-label.js";
export { studyFindings, type StudyFindingsInput } from "./study-findings.js";
export { studyHeadReports, type StudyBaseline } from "./study-head-reports.js";
export { studyReportInput, type StudyReportExtras } from "./study-report-input.js";
export { treesOnlyScorer } from "./trees-only-scorer.js";
export { windowFigure, type SegmentWindowFigure, type WindowFigure } from "./window-figure.js";
