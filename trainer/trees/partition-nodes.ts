import type { SplitChoice } from "./find-best-split.js";
import type { GrowNode } from "./grow-node.js";
import type { TrainingBuffers } from "./training-buffers.js";
import type { TreeTaskPool } from "./tree-task-pool.js";
import { TaskList, TreeTaskOp } from "./tree-task-op.js";

/**
 * Splits the rows of every node in `splits` in one round: each segment is
 * partitioned in place (left rows first, see partitionRows), so a child's rows
 * are the left (or right) parts of its parent's segments; no count pass and no
 * copy between buffers. Returns the [left, right] children, without histograms.
 * The split tables must already be in buffers.goesRight.
 *
 * @example
 * const [[left, right]] = await partitionNodes(pool, buffers, [{ node, choice }]);
 */
export async function partitionNodes(
  pool: TreeTaskPool,
  buffers: TrainingBuffers,
  splits: readonly { node: GrowNode; choice: SplitChoice }[],
): Promise<[GrowNode, GrowNode][]> {
  const tasks = new TaskList();
  for (const { node, choice } of splits) {
    for (let k = 0; k < node.segments.length; k += 2) {
      const start = node.segments[k];
      const end = node.segments[k + 1];
      tasks.add(end - start, start, end, choice.column, node.id, tasks.length);
    }
  }
  await pool.run(TreeTaskOp.partition, tasks.ints());
  const counts = buffers.counts;
  let slot = 0;
  return splits.map(({ node, choice }): [GrowNode, GrowNode] => {
    const left: number[] = [];
    const right: number[] = [];
    let leftCount = 0;
    for (let k = 0; k < node.segments.length; k += 2) {
      const start = node.segments[k];
      const end = node.segments[k + 1];
      const middle = start + counts[slot++];
      if (middle > start) left.push(start, middle);
      if (end > middle) right.push(middle, end);
      leftCount += middle - start;
    }
    if (leftCount !== choice.left.count) {
      // The histogram's counts and the partition must agree; anything else is a bug.
      throw new Error(
        `trees: node ${node.id} sent ${leftCount} rows left, its histogram counted ${choice.left.count}`,
      );
    }
    const child = (id: number, segments: number[], side: SplitChoice["left"]): GrowNode => ({
      id,
      depth: node.depth + 1,
      segments,
      count: side.count,
      gradient: side.gradient,
      hessian: side.hessian,
      hist: null,
    });
    return [child(2 * node.id + 1, left, choice.left), child(2 * node.id + 2, right, choice.right)];
  });
}
