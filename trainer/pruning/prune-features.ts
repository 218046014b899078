import { LeafcastError } from "../errors.js";
import { resolveDatasetSchema, type ResolvedSchema } from "../schema/load-dataset-schema.js";
import {
  checkConfigAgainstSchema,
  type ResolvedTrainingConfig,
} from "../schema/load-training-config.js";
import { checkPruningOptions } from "./check-pruning-options.js";
import { chooseDrops } from "./choose-drops.js";
import { fitPruningStep, type StepFeatures } from "./fit-pruning-step.js";
import type { ImportanceOfForests } from "./importance-of-forests.js";
import { readPruningSample } from "./read-pruning-sample.js";
import { reducedSchemaDocument } from "./reduced-schema-document.js";

export interface PruneFeaturesOptions {
  /** Share of the sample held out to measure NE on. Default 0.2. */
  readonly heldOutFraction?: number;
  /**
   * Features dropped per step: a whole number >= 1 drops that many; a number in
   * (0, 1) drops that share of the features still kept, rounded up. Default 1.
   */
  readonly dropPerStep?: number;
  /** Never keep fewer features than this. Default 1. */
  readonly minFeatures?: number;
  /**
   * Stop when a step's held-out NE of any outcome exceeds the NE with every
   * feature by more than this share (0.002: 0.2 % worse). Default 0.002.
   */
  readonly neTolerance?: number;
  /** Features never dropped (in addition to those the heads read directly). */
  readonly protect?: readonly string[];
  /** Threads for tree fitting; default config.workers. */
  readonly workers?: number;
  /**
   * "trees" (default): held-out NE of each outcome's forest alone. "hybrid": heads
   * are learned on the training rows at every step (config.heads) and NE is that of
   * trees plus heads, per head outcome: the served model, at the cost of a head
   * pass per step.
   */
  readonly measure?: "trees" | "hybrid";
  /** Called after every refit, e.g. to print a line. */
  readonly onStep?: (step: PruningStepResult) => void;
}

/** One refit of the loop. */
export interface PruningStepResult {
  /** Tree features in this step's fit (numeric, then categorical with few values). */
  readonly featuresKept: number;
  readonly features: readonly string[];
  /** Held-out NE per outcome: each forest alone, or trees plus heads (options.measure). */
  readonly heldOutNe: Readonly<Record<string, number>>;
  /** Features dropped to reach this step (empty for the first). */
  readonly dropped: readonly string[];
  /** False for a step whose NE passed the tolerance: its drops are undone. */
  readonly accepted: boolean;
  readonly importance: ImportanceOfForests;
}

export interface PruneFeaturesResult {
  readonly steps: readonly PruningStepResult[];
  /** Features dropped by the accepted steps, in the order dropped: write these as "ignore". */
  readonly dropped: readonly string[];
  /** Tree features kept after the last accepted step. */
  readonly kept: readonly string[];
  /** The features the loop could drop; the others were protected or unusable by the trees. */
  readonly candidates: readonly string[];
  /** Outcomes whose NE is measured: those with a forest, or with "hybrid" those with a head. */
  readonly outcomes: readonly string[];
  readonly measure: "trees" | "hybrid";
  readonly stopReason: "min_features" | "ne_tolerance" | "no_candidates";
  readonly heldOutBy: "time" | "seeded";
  readonly rowsRead: number;
  readonly trainRows: number;
  readonly heldOutRows: number;
}

/**
 * Feature pruning by refitting. Reads the files once into a seeded sample
 * (readPruningSample: the latest share of rows held out when the schema has a
 * timestamp, else a seeded share), fits the forests on the training rows with
 * every tree feature (numeric features and categorical ones with at most
 * trees.maxCategories values), then again and again drops the weakest droppable
 * features (unused ones first, then by combined gain share; see chooseDrops),
 * refits and records each forest's held-out NE. It stops at `minFeatures`, when
 * nothing is left to drop, or at the first step whose NE of any outcome is worse
 * than the all-features NE by more than `neTolerance` (that step is kept in the
 * record, marked not accepted, and its drops are not in `dropped`).
 *
 * By default NE is measured on the trees alone, not on trees plus heads:
 * pruning removes inputs of the trees, and the forests' own held-out NE shows
 * what each input buys without the noise of an online head pass (whose result
 * also depends on alpha and row order), at a fraction of the cost. With
 * `measure: "hybrid"` heads are learned at every step and the served model's NE
 * decides instead. Features the heads read directly (heads.numeric, an explicit
 * heads.hashed list, crosses) are protected.
 *
 * @example
 * const result = await pruneFeatures(["plots.parquet"], schema, config, { dropPerStep: 2, minFeatures: 4 });
 * await writeReducedSchema("plots.pruned.schema.json", schema, result.dropped);
 */
export async function pruneFeatures(
  paths: readonly string[],
  schema: ResolvedSchema,
  config: ResolvedTrainingConfig,
  options: PruneFeaturesOptions = {},
): Promise<PruneFeaturesResult> {
  checkConfigAgainstSchema(config, schema);
  const dropPerStep = options.dropPerStep ?? 1;
  const minFeatures = options.minFeatures ?? 1;
  const neTolerance = options.neTolerance ?? 0.002;
  checkPruningOptions(schema, dropPerStep, minFeatures, neTolerance, options.protect ?? []);
  const sample = await readPruningSample(paths, schema, config, options.heldOutFraction ?? 0.2);
  const outcomes =
    config.trees.outcomes ??
    schema.outcomes.filter((o) => (sample.trainingRate.get(o) ?? 0) >= config.trees.minForestRate);
  if (outcomes.length === 0) {
    const rates = [...sample.trainingRate].map(([o, r]) => `${o} ${r.toFixed(4)}`).join(", ");
    throw new LeafcastError("pruning", [
      {
        code: "no_forest_outcome",
        message: `expected an outcome with a positive rate of at least ${config.trees.minForestRate} (trees.minForestRate), found ${rates}`,
      },
    ]);
  }
  // Categorical features the trees split on natively; wider ones are the heads' alone.
  const narrow = schema.categorical.filter(
    (name) =>
      distinctCodes(sample.train.codes.get(name) as Int32Array) <= config.trees.maxCategories,
  );
  const treeFeatures = [...schema.numeric, ...narrow];
  const protectedNames = new Set([
    ...(options.protect ?? []),
    ...config.heads.numeric,
    ...(config.heads.hashed ?? []),
    ...config.heads.crosses.flat(),
  ]);
  const candidates = treeFeatures.filter((name) => !protectedNames.has(name));
  const workers = options.workers ?? config.workers;
  const measure = options.measure ?? "trees";
  const fitWithout = (gone: ReadonlySet<string>) => {
    const features: StepFeatures = {
      numeric: schema.numeric.filter((n) => !gone.has(n)),
      categorical: schema.categorical.filter((n) => !gone.has(n)),
    };
    const headsSchema =
      measure === "hybrid"
        ? resolveDatasetSchema(reducedSchemaDocument(schema, [...gone]), schema.name)
        : undefined;
    return fitPruningStep(sample, features, outcomes, config, { workers, headsSchema });
  };

  const steps: PruningStepResult[] = [];
  const gone = new Set<string>();
  const record = (
    fitted: Awaited<ReturnType<typeof fitWithout>>,
    dropped: readonly string[],
    accepted: boolean,
    without: ReadonlySet<string>,
  ): PruningStepResult => {
    const features = treeFeatures.filter((n) => !without.has(n));
    const step: PruningStepResult = {
      featuresKept: features.length,
      features,
      heldOutNe: fitted.heldOutNe,
      dropped,
      accepted,
      importance: fitted.importance,
    };
    steps.push(step);
    options.onStep?.(step);
    return step;
  };
  let last = record(await fitWithout(gone), [], true, gone);
  const reference = last.heldOutNe;
  const measured = Object.keys(reference);
  let stopReason: PruneFeaturesResult["stopReason"] = "no_candidates";
  for (;;) {
    const droppable = candidates.filter((n) => !gone.has(n));
    const room = last.featuresKept - minFeatures;
    if (room <= 0) {
      stopReason = "min_features";
      break;
    }
    if (droppable.length === 0) {
      stopReason = "no_candidates";
      break;
    }
    const want = dropPerStep >= 1 ? dropPerStep : Math.ceil(dropPerStep * last.featuresKept - 1e-9);
    const drops = chooseDrops(last.importance.combined, droppable, Math.min(want, room));
    const next = new Set([...gone, ...drops]);
    const fitted = await fitWithout(next);
    const worse = measured.some((o) => !(fitted.heldOutNe[o] <= reference[o] * (1 + neTolerance)));
    if (worse) {
      record(fitted, drops, false, next);
      stopReason = "ne_tolerance";
      break;
    }
    for (const name of drops) gone.add(name);
    last = record(fitted, drops, true, gone);
  }
  return {
    steps,
    dropped: [...gone],
    kept: last.features,
    candidates,
    outcomes: measured,
    measure,
    stopReason,
    heldOutBy: sample.heldOutBy,
    rowsRead: sample.rowsRead,
    trainRows: sample.train.rowCount,
    heldOutRows: sample.heldOut.rowCount,
  };
}

function distinctCodes(codes: Int32Array): number {
  const seen = new Set<number>();
  for (let r = 0; r < codes.length; r++) if (codes[r] >= 0) seen.add(codes[r]);
  return seen.size;
}
