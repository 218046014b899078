import type { ResolvedSchema } from "../schema/load-dataset-schema.js";
import type { ResolvedTrainingConfig } from "../schema/load-training-config.js";
import { binFeatures } from "../trees/bin-features.js";
import { fitForests } from "../trees/fit-forests.js";
import { forestFileOf, type ForestFile } from "../trees/forest-file.js";
import { hybridHeldOutNe } from "./hybrid-held-out-ne.js";
import { importanceOfForests, type ImportanceOfForests } from "./importance-of-forests.js";
import type { PruningSample } from "./read-pruning-sample.js";
import { treesHeldOutNe } from "./trees-held-out-ne.js";

/** The features one step fits on, by kind. */
export interface StepFeatures {
  readonly numeric: readonly string[];
  readonly categorical: readonly string[];
}

/** One refit: the forests, their importance and their held-out NE. */
export interface FittedStep {
  readonly forests: ForestFile;
  readonly importance: ImportanceOfForests;
  /** Held-out NE per outcome: of each forest on its own, or of trees plus heads when asked for. */
  readonly heldOutNe: Readonly<Record<string, number>>;
}

export interface FitPruningStepOptions {
  /** Threads for tree fitting; default config.workers. */
  readonly workers?: number;
  /**
   * The step's (reduced) dataset schema: when given, heads are learned on the
   * training rows and NE is that of trees plus heads (hybridHeldOutNe); otherwise
   * of each forest alone (treesHeldOutNe).
   */
  readonly headsSchema?: ResolvedSchema;
}

/**
 * Fits one forest per outcome on the sample's training rows with the given
 * features only (binned afresh, config.trees settings, config.seed), and measures
 * held-out NE: of each forest alone (treesHeldOutNe), or with `headsSchema` of
 * trees plus heads (hybridHeldOutNe). Early stopping inside the fit
 * uses config.trees.validationFraction of the training rows; the held-out rows are
 * never seen.
 *
 * @example
 * const step = await fitPruningStep(sample, { numeric: ["tie_strength"], categorical: [] }, ["open"], config);
 * step.heldOutNe.open; // e.g. 0.93
 */
export async function fitPruningStep(
  sample: PruningSample,
  features: StepFeatures,
  outcomes: readonly string[],
  config: ResolvedTrainingConfig,
  options: FitPruningStepOptions = {},
): Promise<FittedStep> {
  const workers = options.workers ?? config.workers;
  const { train } = sample;
  const binned = binFeatures(
    {
      rowCount: train.rowCount,
      numeric: features.numeric.map((name) => ({
        name,
        values: train.numbers.get(name) as Float64Array,
      })),
      categorical: features.categorical.map((name) => ({
        name,
        codes: train.codes.get(name) as Int32Array,
        dictionary: sample.dictionaries.get(name)?.list() ?? [],
      })),
    },
    {
      bins: config.trees.bins,
      binSampleRows: config.trees.binSampleRows,
      maxCategories: config.trees.maxCategories,
      seed: config.seed,
    },
  );
  const fitted = await fitForests(
    binned,
    outcomes.map((outcome) => ({ outcome, label: train.labels.get(outcome) as Uint8Array })),
    {
      settings: config.trees,
      seed: config.seed,
      workers,
      weight: train.weight,
      timestamp: train.timestamp,
    },
  );
  const forests = forestFileOf(binned, fitted, config.trees, config.seed);
  const models = forests.forests.map((f) => f.forest);
  return {
    forests,
    importance: importanceOfForests(
      forests.forests.map((f) => ({ forest: f.forest.outcome, features: f.importance })),
    ),
    heldOutNe:
      options.headsSchema === undefined
        ? treesHeldOutNe(
            models,
            forests.contract,
            sample.heldOut,
            sample.dictionaries,
            sample.trainingRate,
          )
        : await hybridHeldOutNe(forests, sample, options.headsSchema, config),
  };
}
