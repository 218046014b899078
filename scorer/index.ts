/**
 * The scorer package: load a Leafcast artifact and score items with no
 * dependencies, no Node built-ins and no code generation, in Node or a browser.
 * This is the one public index; the trainer imports the same kernels for its
 * leaf encoding, so training and serving compute the same features.
 *
 * @example
 * import { loadScorer } from "leafcast/scorer";
 * const scorer = loadScorer(artifactText);
 * scorer.scoreOne({ tie_strength: 0.4, crop: "kale" }); // { probability: { open: ..., ... }, combined: ... }
 */
export { loadScorer } from "./load-scorer.js";
export { createScorer } from "./create-scorer.js";
export { Scorer, type ScoreResult, type BatchScores } from "./scorer.js";
export type { ScoreItem } from "./score-item.js";
export type { ColumnarBatch, ColumnInput } from "./columnar-batch.js";
export { columnsFromItems } from "./columns-from-items.js";
export {
  measureLatency,
  type LatencyDistribution,
  type LatencyOptions,
  type LatencyReport,
} from "./measure-latency.js";
export { ScorerError, type ScorerIssue } from "./scorer-error.js";
export { checkArtifact } from "./check-artifact.js";
export { modelFromArtifact } from "./model-from-artifact.js";
export { artifactChecksum } from "./artifact-checksum.js";
export { ARTIFACT_FORMAT, ARTIFACT_FORMAT_VERSION } from "./artifact-format.js";
export { artifactSchemaDocument, type ScorerArtifact } from "./artifact.generated.js";
export { canonicalJson } from "./canonical-json.js";
export { sha256Hex } from "./sha256.js";
export { murmur3, murmur3Parts } from "./murmur3.js";
export { checkScoringModel } from "./check-scoring-model.js";
export { checkForestModel } from "./check-forest-model.js";
export { encodedLayout, type EncodedLayout } from "./encoded-layout.js";
export { RowEncoder, type EncodedBuffers } from "./row-encoder.js";
export { ForestEvaluator } from "./forest-evaluator.js";
export type { ForestColumns, ForestRows } from "./forest-input.js";
export { checkJsonSchema, type JsonSchema, type SchemaIssue } from "./json-schema-check.js";
export type {
  CategoricalFeature,
  EncodedBatch,
  EncodingSpec,
  FeatureContract,
  ForestModel,
  HeadModel,
  ScoringModel,
  TreeModel,
} from "./model-types.js";
