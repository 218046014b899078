import type { ForestModel } from "../../scorer/model-types.js";
import { baseLogit } from "./base-logit.js";
import type { BinnedFeatures } from "./binned-features.js";
import { chooseColumns } from "./choose-columns.js";
import { featureImportance } from "./feature-importance.js";
import type { FittedForest, ForestSettings, ForestTarget } from "./fit-forests.js";
import type { ForestProgress } from "./forest-checkpoint.js";
import { gradientRound } from "./gradient-round.js";
import type { GrownTree } from "./grown-tree.js";
import { placeTreeRows } from "./place-tree-rows.js";
import { rebuildCheckpointScores } from "./rebuild-checkpoint-scores.js";
import type { SeededRandom } from "./seeded-random.js";
import { toTreeModel } from "./to-tree-model.js";
import { LeafcastError } from "../errors.js";
import type { TrainingBuffers } from "./training-buffers.js";
import type { TreeGrower } from "./tree-grower.js";
import { TaskList, TreeTaskOp } from "./tree-task-op.js";
import type { TreeTaskPool } from "./tree-task-pool.js";

/** What every forest of one fitting run shares. */
export interface ForestRun {
  readonly binned: BinnedFeatures;
  readonly buffers: TrainingBuffers;
  readonly pool: TreeTaskPool;
  readonly grower: TreeGrower;
  readonly settings: ForestSettings;
  readonly trainRows: Uint32Array;
  /** 1 for validation rows; null without a validation set. */
  readonly validation: Uint8Array | null;
  readonly weight: Float64Array | null;
  /** trainPositions() when trees use every training row; null when they sample rows. */
  readonly positions: Int32Array | null;
  readonly returnScores: boolean;
  /** Called after every tree with the losses under the trees so far. */
  readonly onTree: (tree: number, trainLoss: number, validationLoss: number | null) => void;
  /**
   * Called after every tree with the forest's progress (complete after its last
   * tree), e.g. to save a checkpoint; awaited before the next tree.
   */
  readonly afterTree?: (progress: ForestProgress) => Promise<void>;
}

/**
 * Boosts one forest: start from the logit of the weighted positive rate, then per
 * tree compute gradients, grow a tree on a seeded row and column sample, and add
 * it to the scores. With a validation set and patience > 0 it stops when the
 * validation loss has not improved for `patience` trees and keeps the trees up to
 * the best one. Given the `resume` progress of a checkpoint, it rebuilds the
 * scores from the trees grown so far and goes on from there: the result is bit
 * for bit that of a run that never stopped.
 *
 * @example
 * const fitted = await fitOneForest(run, { outcome: "open", label }, new SeededRandom(1).fork(1000));
 */
export async function fitOneForest(
  run: ForestRun,
  target: ForestTarget,
  random: SeededRandom,
  resume: ForestProgress | null = null,
): Promise<FittedForest> {
  const { binned, buffers, pool, grower, settings, validation } = run;
  const n = binned.rowCount;
  buffers.label.set(target.label);
  const base = baseLogit(target.label, run.weight, validation);
  const stopsEarly = validation !== null && settings.patience > 0;
  const grown: GrownTree[] = [];
  const trainLoss: number[] = [];
  const validationLoss: number[] | null = validation === null ? null : [];
  let bestLoss = Infinity;
  let bestCount = 0;
  let bestScores: Float64Array | null = null;
  let stopped = false;
  /** Records tree t's losses; true when early stopping ends the forest here. */
  const record = (t: number, train: number, valid: number): boolean => {
    trainLoss.push(train);
    validationLoss?.push(valid);
    if (!stopsEarly) return false;
    if (valid < bestLoss) {
      bestLoss = valid;
      bestCount = t + 1;
      return false;
    }
    return t + 1 - bestCount >= settings.patience;
  };

  let start: { train: number; validation: number };
  if (resume === null) {
    buffers.score.fill(base);
    start = await gradientRound(pool, buffers, n, run.positions, -1);
  } else {
    start = { train: resume.startTrainLoss, validation: resume.startValidationLoss ?? NaN };
    resume.trees.forEach((tree, t) => {
      grown.push(tree);
      stopped = record(t, resume.trainLoss[t], resume.validationLoss?.[t] ?? NaN);
    });
    if (run.returnScores && stopsEarly && bestCount > 0) {
      // The scores at the best tree so far, as the uninterrupted run kept them.
      rebuildCheckpointScores(binned, base, grown.slice(0, bestCount), buffers.score);
      bestScores = buffers.score.slice();
    }
    if (!resume.complete || run.returnScores) {
      rebuildCheckpointScores(binned, base, grown, buffers.score);
    }
    if (!resume.complete) {
      // Gradients for the next tree; the loss must be the one saved after the last tree.
      const loss = await gradientRound(pool, buffers, n, run.positions, -1);
      const last = grown.length - 1;
      const saved =
        last < 0 ? start : { train: trainLoss[last], validation: validationLoss?.[last] ?? NaN };
      if (
        !sameLoss(loss.train, saved.train) ||
        (validation !== null && !sameLoss(loss.validation, saved.validation))
      ) {
        throw new LeafcastError("checkpoint", [
          {
            code: "checkpoint_mismatch",
            message: `forest "${target.outcome}": expected the saved training loss ${saved.train} after ${grown.length} trees, found ${loss.train}; remove the checkpoint (or pass --restart) to start over`,
          },
        ]);
      }
    }
  }
  const progress = (): ForestProgress => ({
    outcome: target.outcome,
    startTrainLoss: start.train,
    startValidationLoss: validation === null ? null : start.validation,
    trees: grown,
    trainLoss,
    validationLoss,
    complete: stopped || grown.length >= settings.count,
  });

  const alreadyComplete = resume !== null && resume.complete;
  for (let t = grown.length; t < settings.count && !stopped && !alreadyComplete; t++) {
    const treeRandom = random.fork(t);
    let rootCount = run.trainRows.length;
    // With every training row in the tree, the gradient round has placed them already.
    if (run.positions === null) {
      rootCount = placeTreeRows(buffers, run.trainRows, settings.rowFraction, treeRandom);
      await placeRows(pool, rootCount, buffers.blockRows);
    }
    const allowed = chooseColumns(binned.columnCount, settings.featureFraction, treeRandom);
    const tree = await grower.grow(rootCount, allowed);
    // Adds the tree to every row's score, then the next tree's gradients.
    const loss = await gradientRound(pool, buffers, n, run.positions, tree.depth);
    grown.push(tree);
    const before = bestCount;
    stopped = record(t, loss.train, loss.validation);
    if (run.returnScores && bestCount !== before) bestScores = buffers.score.slice();
    run.onTree(t, loss.train, validationLoss === null ? null : loss.validation);
    await run.afterTree?.(progress());
  }
  const fitted = grown.length;
  const kept = stopsEarly ? bestCount : fitted;
  const keptTrees = grown.slice(0, kept);
  let depth = 1;
  for (const tree of keptTrees) depth = Math.max(depth, tree.depth);
  const forest: ForestModel = {
    outcome: target.outcome,
    baseLogit: base,
    depth,
    trees: keptTrees.map((tree) => toTreeModel(tree, binned, depth)),
  };
  let scores: Float64Array | null = null;
  if (run.returnScores) scores = kept < fitted ? bestScores : buffers.score.slice();
  return {
    forest,
    trainLoss: Float64Array.from(trainLoss),
    validationLoss: validationLoss === null ? null : Float64Array.from(validationLoss),
    startTrainLoss: start.train,
    startValidationLoss: validation === null ? null : start.validation,
    treesFitted: fitted,
    importance: featureImportance(keptTrees, binned),
    scores,
  };
}

/** Equal bits, NaN included (a side without weight has a NaN loss). */
function sameLoss(a: number, b: number): boolean {
  return Object.is(a, b);
}

/**
 * Copies the bins and gradient pairs (from gradHess) of a row sample's rows to
 * their positions in buffers.placed and buffers.ordered.
 */
async function placeRows(pool: TreeTaskPool, count: number, blockRows: number): Promise<void> {
  const tasks = new TaskList();
  for (let s = 0; s < count; s += blockRows) {
    const end = Math.min(s + blockRows, count);
    tasks.add(end - s, s, end, 1);
  }
  await pool.run(TreeTaskOp.place, tasks.ints());
}
