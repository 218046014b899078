// Every public export of the pruning package (importance, the refit loop, the reduced schema), in one place.
export { checkPruningOptions } from "./check-pruning-options.js";
export { chooseDrops } from "./choose-drops.js";
export {
  fitPruningStep,
  type FitPruningStepOptions,
  type FittedStep,
  type StepFeatures,
} from "./fit-pruning-step.js";
export { hybridHeldOutNe } from "./hybrid-held-out-ne.js";
export { formatPruningTable } from "./format-pruning-table.js";
export {
  importanceOfForests,
  type CombinedImportance,
  type ForestImportanceOf,
  type ImportanceOfForests,
} from "./importance-of-forests.js";
export {
  pruneFeatures,
  type PruneFeaturesOptions,
  type PruneFeaturesResult,
  type PruningStepResult,
} from "./prune-features.js";
export { pruningReportInput } from "./pruning-report-input.js";
export { readPruningSample, type PruningSample, type SampleRows } from "./read-pruning-sample.js";
export { sampleBatches } from "./sample-batches.js";
export { reducedSchemaDocument } from "./reduced-schema-document.js";
export { treesHeldOutNe } from "./trees-held-out-ne.js";
export { writeReducedSchema } from "./write-reduced-schema.js";
