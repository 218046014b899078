import type { LeafRange } from "./grow-node.js";
import type { GrownTree } from "./grown-tree.js";
import type { TrainingBuffers } from "./training-buffers.js";
import type { TreeTaskPool } from "./tree-task-pool.js";
import { TaskList, TreeTaskOp } from "./tree-task-op.js";

/**
 * Adds a grown tree's leaf values to the raw scores: the tree's own rows by their
 * leaf ranges (values in buffers.nodeValue), and the first `otherCount` rows of
 * buffers.otherRows (validation and unsampled rows) by traversing the binned
 * tree. Call right after growing: the ranges point into buffers.rows.
 *
 * @example
 * await applyTreeToScores(pool, buffers, tree, leaves, validRows.length);
 */
export async function applyTreeToScores(
  pool: TreeTaskPool,
  buffers: TrainingBuffers,
  tree: GrownTree,
  leaves: readonly LeafRange[],
  otherCount: number,
): Promise<void> {
  const adds = new TaskList();
  for (const leaf of leaves) {
    for (let k = 0; k < leaf.segments.length; k += 2) {
      const start = leaf.segments[k];
      const end = leaf.segments[k + 1];
      if (leaf.column < 0) adds.add(end - start, start, end, leaf.node);
      else adds.add(end - start, start, end, leaf.node, leaf.column);
    }
  }
  await pool.run(TreeTaskOp.addLeaf, adds.ints());
  if (otherCount === 0) return;
  const depth = tree.depth;
  buffers.leafValue.fill(0, 0, 2 ** depth);
  for (const leaf of tree.leaves) {
    const position = leaf.node - (2 ** leaf.depth - 1);
    buffers.leafValue[position * 2 ** (depth - leaf.depth)] = leaf.value;
  }
  const traverse = new TaskList();
  for (let s = 0; s < otherCount; s += buffers.blockRows) {
    const end = Math.min(s + buffers.blockRows, otherCount);
    traverse.add(end - s, s, end, depth);
  }
  await pool.run(TreeTaskOp.traverse, traverse.ints());
}
