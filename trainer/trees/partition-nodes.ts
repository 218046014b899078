import type { SplitChoice } from "./find-best-split.js";
import type { GrowNode } from "./grow-node.js";
import { groupSegments } from "./group-segments.js";
import type { NodeHistograms } from "./node-histograms.js";
import type { TrainingBuffers } from "./training-buffers.js";
import type { TreeTaskPool } from "./tree-task-pool.js";
import { TaskList, TreeTaskOp } from "./tree-task-op.js";

type Split = { readonly node: GrowNode; readonly choice: SplitChoice };

/**
 * Splits the rows of every node in `splits` and builds the histogram of each
 * split's smaller child in the same pass, in as few worker rounds as the shared
 * block buffer allows (usually one per level). Each segment is partitioned in
 * place (left rows first, see partitionRows), so a child's rows are the left (or
 * right) parts of its parent's segments; no count pass and no copy between
 * buffers. A node's segments are grouped into blocks (groupSegments) and each
 * block's smaller-child rows are summed from zero by one worker right after their
 * segment is partitioned, while it is in cache; the blocks are then added in
 * order, so the histogram is the same bit for bit with any number of workers.
 * Returns the [left, right] children with their row counts; the one with less
 * hessian (left on a tie) has its histogram. The split tables must already be in
 * buffers.goesRight.
 *
 * @example
 * const [[left, right]] = await partitionNodes(pool, buffers, histograms, [{ node, choice }]);
 */
export async function partitionNodes(
  pool: TreeTaskPool,
  buffers: TrainingBuffers,
  histograms: NodeHistograms,
  splits: readonly Split[],
): Promise<[GrowNode, GrowNode][]> {
  const children: [GrowNode, GrowNode][] = [];
  let tasks = new TaskList();
  let planned: {
    split: Split;
    firstBlock: number;
    blocks: number;
    firstCount: number;
    smallerRight: number;
  }[] = [];
  let segments = 0;
  const flush = async (): Promise<void> => {
    if (planned.length === 0) return;
    await pool.run(TreeTaskOp.partition, tasks.ints());
    for (const plan of planned) {
      const pair = splitChildren(plan.split, buffers.counts, plan.firstCount);
      pair[plan.smallerRight].hist = histograms.collect(plan.firstBlock, plan.blocks);
      children.push(pair);
    }
    tasks = new TaskList();
    planned = [];
    segments = 0;
  };
  for (const split of splits) {
    const { node, choice } = split;
    const blocks = groupSegments(node.segments, buffers.blockRows);
    const nodeSegments = node.segments.length / 2;
    if (
      tasks.length + blocks.length > histograms.capacity ||
      segments + nodeSegments > buffers.counts.length
    ) {
      await flush();
    }
    // The side with less hessian stands in for the side with fewer rows (counts come
    // from this very pass); any choice gives the same histograms, only the work differs.
    const smallerRight = choice.left.hessian <= choice.right.hessian ? 0 : 1;
    planned.push({
      split,
      firstBlock: tasks.length,
      blocks: blocks.length,
      firstCount: segments,
      smallerRight,
    });
    for (const block of blocks) {
      tasks.add(
        block.rows,
        tasks.length,
        smallerRight,
        choice.column,
        node.id,
        segments,
        ...block.segments,
      );
      segments += block.segments.length / 2;
    }
  }
  await flush();
  return children;
}

/** The two children of a partitioned split, from the left counts of its segments. */
function splitChildren(
  { node, choice }: Split,
  counts: Int32Array,
  firstCount: number,
): [GrowNode, GrowNode] {
  const left: number[] = [];
  const right: number[] = [];
  let leftCount = 0;
  let slot = firstCount;
  for (let k = 0; k < node.segments.length; k += 2) {
    const start = node.segments[k];
    const end = node.segments[k + 1];
    const middle = start + counts[slot++];
    if (middle > start) left.push(start, middle);
    if (end > middle) right.push(middle, end);
    leftCount += middle - start;
  }
  const child = (
    id: number,
    segments: number[],
    count: number,
    side: SplitChoice["left"],
  ): GrowNode => ({
    id,
    depth: node.depth + 1,
    segments,
    count,
    gradient: side.gradient,
    hessian: side.hessian,
    hist: null,
  });
  return [
    child(2 * node.id + 1, left, leftCount, choice.left),
    child(2 * node.id + 2, right, node.count - leftCount, choice.right),
  ];
}
