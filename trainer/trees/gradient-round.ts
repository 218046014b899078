import type { TrainingBuffers } from "./training-buffers.js";
import type { TreeTaskPool } from "./tree-task-pool.js";
import { TaskList, TreeTaskOp } from "./tree-task-op.js";

/** Rows per loss block: the loss is summed per block, then the blocks in order. */
const LOSS_BLOCK_ROWS = 65_536;

/**
 * Loss blocks of n rows (buffers.sums holds 4 numbers per block).
 *
 * @example
 * lossBlocks(100_000); // 2
 */
export function lossBlocks(n: number): number {
  return Math.ceil(n / LOSS_BLOCK_ROWS);
}

/**
 * Per loss block: the position, among the training rows in row order, of the
 * block's first training row (for gradientRound's packed mode).
 *
 * @example
 * trainPositions(null, 100_000); // Int32Array [0, 65536]
 */
export function trainPositions(validation: Uint8Array | null, n: number): Int32Array {
  const positions = new Int32Array(lossBlocks(n));
  let train = 0;
  for (let r = 0; r < n; r++) {
    if (r % LOSS_BLOCK_ROWS === 0) positions[r / LOSS_BLOCK_ROWS] = train;
    if (validation === null || validation[r] === 0) train++;
  }
  return positions;
}

/**
 * Adds the tree just grown to every row's score (with `treeDepth` >= 0: the
 * tree in buffers.nodeColumn, goesRight and leafValue, see addTreeToScores; -1
 * when the scores are already current), computes every row's gradient and
 * hessian for the next tree from the new scores, and returns the weighted mean log loss of the training and validation
 * rows under those scores (NaN for a side without weight). With `positions`
 * (trainPositions) the training rows' pairs go straight to buffers.ordered in
 * row order, which is where a tree on all training rows reads them, and each
 * block also sums its rows into a block histogram while they are in cache: the
 * next tree's root histogram comes out of this round (buffers.rootHistBlocks;
 * TreeGrower takes it) instead of a pass of its own. Without `positions` the
 * pairs go to buffers.gradHess by row. Losses and histograms are summed per
 * fixed block and the blocks added in order, so they are the same for any
 * number of workers.
 *
 * @example
 * const { train, validation } = await gradientRound(pool, buffers, binned.rowCount, positions, tree.depth);
 */
export async function gradientRound(
  pool: TreeTaskPool,
  buffers: TrainingBuffers,
  n: number,
  positions: Int32Array | null,
  treeDepth: number,
): Promise<{ train: number; validation: number }> {
  const tasks = new TaskList();
  const blocks = lossBlocks(n);
  const withRoot =
    positions !== null &&
    buffers.histSize > 0 &&
    buffers.blockHist.length >= blocks * buffers.histSize;
  for (let s = 0; s < n; s += LOSS_BLOCK_ROWS) {
    const end = Math.min(s + LOSS_BLOCK_ROWS, n);
    const k = tasks.length;
    const position = positions === null ? -1 : positions[k];
    tasks.add(end - s, s, end, k, position, withRoot ? k : -1, treeDepth);
  }
  buffers.rootHistBlocks[0] = 0;
  await pool.run(TreeTaskOp.gradients, tasks.ints());
  if (withRoot) buffers.rootHistBlocks[0] = blocks;
  const sums = buffers.sums;
  let trainLoss = 0;
  let trainWeight = 0;
  let validLoss = 0;
  let validWeight = 0;
  for (let k = 0; k < tasks.length; k++) {
    trainLoss += sums[4 * k];
    trainWeight += sums[4 * k + 1];
    validLoss += sums[4 * k + 2];
    validWeight += sums[4 * k + 3];
  }
  return {
    train: trainWeight > 0 ? trainLoss / trainWeight : NaN,
    validation: validWeight > 0 ? validLoss / validWeight : NaN,
  };
}
