import type { InputFileIdentity } from "../io/input-file-identity.js";
import type { GrownTree } from "./grown-tree.js";

/** `format` and `version` of a tree-fitting checkpoint file. */
export const FOREST_CHECKPOINT_FORMAT = "leafcast-tree-checkpoint";
export const FOREST_CHECKPOINT_VERSION = 1;

/**
 * One forest as far as it got: the trees grown so far, in bins (the form the
 * learner can score its rows with again), and the losses after each. With
 * these and the seed, fitting goes on exactly as if it had never stopped: tree
 * t's row and column samples come from a generator forked for t alone, and the
 * rows' scores are the starting log-odds plus each tree's leaf value, added in
 * tree order (rebuildCheckpointScores).
 *
 * @example
 * const progress: ForestProgress = { outcome: "open", startTrainLoss: 0.61, startValidationLoss: null, trees: [], trainLoss: [], validationLoss: null, complete: false };
 */
export interface ForestProgress {
  readonly outcome: string;
  readonly startTrainLoss: number;
  readonly startValidationLoss: number | null;
  readonly trees: readonly GrownTree[];
  readonly trainLoss: readonly number[];
  /** null without a validation set. */
  readonly validationLoss: readonly number[] | null;
  /** True once the forest has all its trees or stopped early: nothing is left to fit. */
  readonly complete: boolean;
}

/**
 * What a checkpoint was made from. A run resumes from it only when all of it
 * matches: the same input files (name, size, time of change), the same schema
 * and tree settings (seed included), and the same binned sample and labels.
 */
export interface ForestCheckpointInputs {
  readonly files: readonly InputFileIdentity[];
  /** fingerprintSchema of the dataset schema. */
  readonly schema: string;
  /** SHA-256 of the seed and the tree settings. */
  readonly settings: string;
  /** fingerprintCheckpointSample of the binned rows, labels, weights and times. */
  readonly sample: string;
}

/**
 * A tree-fitting checkpoint: the forests begun so far (every one but the last
 * complete) and what they were fitted on.
 *
 * @example
 * await writeFileAtomic(`${out}.checkpoint`, encodeForestCheckpoint({ inputs, forests }));
 */
export interface ForestCheckpoint {
  readonly inputs: ForestCheckpointInputs;
  readonly forests: readonly ForestProgress[];
}

/**
 * How fitForests takes part in checkpoints. The caller owns the file and checks
 * that a checkpoint matches these inputs before handing its progress in.
 */
export interface ForestCheckpointing {
  /** The forests of a matching checkpoint, in target order; null or empty: start afresh. */
  readonly resume: readonly ForestProgress[] | null;
  /** Save after every this many new trees (0: not by count). */
  readonly everyTrees: number;
  /** Save once this many seconds have passed since the last save (0: not by time). */
  readonly everySeconds: number;
  /** Saves the progress of every forest begun so far; awaited before fitting goes on. */
  readonly save: (forests: readonly ForestProgress[]) => Promise<void>;
}
