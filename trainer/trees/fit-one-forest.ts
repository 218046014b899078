import type { ForestModel } from "../../scorer/model-types.js";
import { applyTreeToScores } from "./apply-tree-to-scores.js";
import { baseLogit } from "./base-logit.js";
import type { BinnedFeatures } from "./binned-features.js";
import { chooseColumns } from "./choose-columns.js";
import { featureImportance } from "./feature-importance.js";
import type { FittedForest, ForestSettings, ForestTarget } from "./fit-forests.js";
import { gradientRound } from "./gradient-round.js";
import type { GrownTree } from "./grown-tree.js";
import { placeTreeRows } from "./place-tree-rows.js";
import type { SeededRandom } from "./seeded-random.js";
import { toTreeModel } from "./to-tree-model.js";
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
  readonly validRows: Uint32Array;
  /** 1 for validation rows; null without a validation set. */
  readonly validation: Uint8Array | null;
  readonly weight: Float64Array | null;
  /** trainPositions() when trees use every training row; null when they sample rows. */
  readonly positions: Int32Array | null;
  readonly returnScores: boolean;
  /** Called after every tree with the losses under the trees so far. */
  readonly onTree: (tree: number, trainLoss: number, validationLoss: number | null) => void;
}

/**
 * Boosts one forest: start from the logit of the weighted positive rate, then per
 * tree compute gradients, grow a tree on a seeded row and column sample, and add
 * it to the scores. With a validation set and patience > 0 it stops when the
 * validation loss has not improved for `patience` trees and keeps the trees up to
 * the best one.
 *
 * @example
 * const fitted = await fitOneForest(run, { outcome: "open", label }, new SeededRandom(1).fork(1000));
 */
export async function fitOneForest(
  run: ForestRun,
  target: ForestTarget,
  random: SeededRandom,
): Promise<FittedForest> {
  const { binned, buffers, pool, grower, settings, validation } = run;
  const n = binned.rowCount;
  buffers.label.set(target.label);
  const base = baseLogit(target.label, run.weight, validation);
  buffers.score.fill(base);
  const start = await gradientRound(pool, buffers, n, run.positions);
  const trainLoss = new Float64Array(settings.count);
  const validationLoss = validation === null ? null : new Float64Array(settings.count);
  const stopsEarly = validation !== null && settings.patience > 0;
  const grown: GrownTree[] = [];
  let bestLoss = Infinity;
  let bestCount = 0;
  let bestScores: Float64Array | null = null;
  for (let t = 0; t < settings.count; t++) {
    const treeRandom = random.fork(t);
    let rootCount = run.trainRows.length;
    // With every training row in the tree, the gradient round has placed them already.
    if (run.positions === null) {
      rootCount = placeTreeRows(
        buffers,
        run.trainRows,
        run.validRows.length,
        settings.rowFraction,
        treeRandom,
      );
      await placeRows(pool, rootCount, buffers.blockRows);
    }
    const allowed = chooseColumns(binned.columnCount, settings.featureFraction, treeRandom);
    const { tree, leaves } = await grower.grow(rootCount, allowed);
    const otherCount = run.validRows.length + run.trainRows.length - rootCount;
    await applyTreeToScores(pool, buffers, tree, leaves, otherCount);
    const loss = await gradientRound(pool, buffers, n, run.positions);
    grown.push(tree);
    trainLoss[t] = loss.train;
    if (validationLoss !== null) validationLoss[t] = loss.validation;
    run.onTree(t, loss.train, validationLoss === null ? null : loss.validation);
    if (!stopsEarly) continue;
    if (loss.validation < bestLoss) {
      bestLoss = loss.validation;
      bestCount = t + 1;
      if (run.returnScores) bestScores = buffers.score.slice();
    } else if (t + 1 - bestCount >= settings.patience) {
      break;
    }
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
    trainLoss: trainLoss.slice(0, fitted),
    validationLoss: validationLoss === null ? null : validationLoss.slice(0, fitted),
    startTrainLoss: start.train,
    startValidationLoss: validation === null ? null : start.validation,
    treesFitted: fitted,
    importance: featureImportance(keptTrees, binned),
    scores,
  };
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
