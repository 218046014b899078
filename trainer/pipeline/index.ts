// Every public export of the pipeline package (files -> encoded batches -> heads), in one place.
export { headBatchOf, type HeadColumns } from "./head-batch-of.js";
export { headEncodingSpec } from "./head-encoding-spec.js";
export {
  headReportSummary,
  renderHeadSummary,
  type HeadSummary,
  type SummaryFigures,
} from "./head-report-summary.js";
export {
  learnHeadsFromFiles,
  type LearnHeadsFromFilesOptions,
  type LearnHeadsFromFilesResult,
} from "./learn-heads-from-files.js";
export { measureNumericStats, type NumericStats } from "./measure-numeric-stats.js";
export { runHeadCommand, type HeadCommandOptions } from "./run-head-command.js";
