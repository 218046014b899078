import type { GrowNode } from "./grow-node.js";
import { groupSegments } from "./group-segments.js";
import { addHistogram, subtractHistogram } from "./histogram-arithmetic.js";
import { HistogramPool } from "./histogram-pool.js";
import type { TrainingBuffers } from "./training-buffers.js";
import type { TreeTaskPool } from "./tree-task-pool.js";
import { TaskList, TreeTaskOp } from "./tree-task-op.js";

/**
 * Builds and recycles node histograms. A node's segments are grouped, in order,
 * into blocks of about buffers.blockRows rows; each block is summed from zero by
 * one worker and the node's blocks are added in block order on this thread, so
 * every sum is associated the same way whatever the number of workers (the trees
 * are then the same bit for bit). Rounds are cut to fit the shared block buffer.
 *
 * @example
 * const histograms = new NodeHistograms(buffers, pool, 64);
 * await histograms.build([left]);
 * right.hist = histograms.subtract(parent, left);
 */
export class NodeHistograms {
  private readonly free: HistogramPool;

  constructor(
    private readonly buffers: TrainingBuffers,
    private readonly pool: TreeTaskPool,
    /** Block histograms the shared buffer holds (at least the most blocks of one node). */
    readonly capacity: number,
  ) {
    this.free = new HistogramPool(buffers.histSize);
  }

  /** Sets node.hist for every node from its rows. */
  async build(nodes: readonly GrowNode[]): Promise<void> {
    let tasks = new TaskList();
    let planned: { node: GrowNode; first: number; blocks: number }[] = [];
    const flush = async (): Promise<void> => {
      if (planned.length === 0) return;
      await this.pool.run(TreeTaskOp.histogram, tasks.ints());
      for (const { node, first, blocks } of planned) node.hist = this.collect(first, blocks);
      tasks = new TaskList();
      planned = [];
    };
    for (const node of nodes) {
      const blocks = groupSegments(node.segments, this.buffers.blockRows);
      if (tasks.length + blocks.length > this.capacity) await flush();
      planned.push({ node, first: tasks.length, blocks: Math.max(1, blocks.length) });
      if (blocks.length === 0) tasks.add(0, tasks.length);
      for (const block of blocks) tasks.add(block.rows, tasks.length, ...block.segments);
    }
    await flush();
  }

  /**
   * A node's histogram from the block histograms first .. first + blocks - 1 of
   * the round just run, added in block order.
   */
  collect(first: number, blocks: number): Float64Array {
    const size = this.buffers.histSize;
    const blockHist = this.buffers.blockHist;
    const hist = this.free.take();
    hist.set(blockHist.subarray(first * size, (first + 1) * size));
    for (let b = 1; b < blocks; b++) addHistogram(hist, blockHist, (first + b) * size);
    return hist;
  }

  /** The histogram of parent's other child: parent minus `child`. */
  subtract(parent: GrowNode, child: GrowNode): Float64Array {
    const hist = this.free.take();
    subtractHistogram(hist, parent.hist as Float64Array, child.hist as Float64Array);
    return hist;
  }

  /** Returns the nodes' histograms to the pool. */
  release(...nodes: GrowNode[]): void {
    for (const node of nodes) {
      if (node.hist !== null) this.free.give(node.hist);
      node.hist = null;
    }
  }
}
