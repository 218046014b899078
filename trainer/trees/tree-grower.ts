import {
  findBestSplit,
  writeSplitTable,
  type HistogramLayout,
  type SplitChoice,
  type SplitRules,
} from "./find-best-split.js";
import type { GrowNode } from "./grow-node.js";
import type { GrownTree } from "./grown-tree.js";
import { SLOT_VALUES } from "./histogram-kernel.js";
import { NodeHistograms } from "./node-histograms.js";
import { partitionNodes } from "./partition-nodes.js";
import type { TrainingBuffers } from "./training-buffers.js";
import type { TreeTaskPool } from "./tree-task-pool.js";

export interface GrowSettings extends SplitRules {
  readonly depth: number;
  readonly leaves: number;
  readonly learningRate: number;
}

type Split = { readonly node: GrowNode; readonly choice: SplitChoice };

/** The per-node arrays of a tree while it grows. */
interface TreeArrays {
  readonly column: Int32Array;
  readonly threshold: Int32Array;
  readonly missingRight: Uint8Array;
  readonly rightBins: (Uint8Array | null)[];
  readonly gain: Float64Array;
  readonly cover: Float64Array;
}

/**
 * Grows one tree at a time over the shared training buffers, level by level.
 *
 * Level-wise rather than best-first: all nodes of a level are partitioned in one
 * worker round trip and all their children's histograms built in the next (a
 * round trip costs about 0.13 ms, performance-notes.md), and the forest is stored
 * as complete trees of a fixed depth anyway, where best-first's deep narrow
 * branches cannot go. The leaf limit is respected by splitting, within a level,
 * the nodes with the largest gains first.
 *
 * The root's histogram comes from the gradient round when the tree has every
 * training row (gradientRound), else from a round of its own. Of two siblings
 * only the one with less hessian gets a histogram from its rows, summed in the
 * same worker pass that partitions the parent (partitionNodes); the other is
 * the parent's minus it (NodeHistograms). Rows move with their bins (buffers.placed),
 * so every node's rows are contiguous memory however deep it is. A split whose
 * two children are final leaves is not partitioned at all: the scores are
 * updated by sending every row down the finished tree (the split tables and
 * buffers.leafValue, written here; see addTreeToScores), not by leaf ranges.
 *
 * @example
 * const grower = new TreeGrower(buffers, pool, layout, settings, 64);
 * const tree = await grower.grow(rootRows, null); // rows at positions 0 .. rootRows - 1
 * await gradientRound(pool, buffers, rowCount, positions, tree.depth); // adds it to the scores
 */
export class TreeGrower {
  private readonly histograms: NodeHistograms;
  private written: number[] = [];

  constructor(
    private readonly buffers: TrainingBuffers,
    private readonly pool: TreeTaskPool,
    private readonly layout: HistogramLayout,
    private readonly settings: GrowSettings,
    histogramBlocks: number,
  ) {
    this.histograms = new NodeHistograms(buffers, pool, histogramBlocks);
  }

  /**
   * Grows a tree on the rows at positions 0 .. rootCount - 1 (bins in
   * buffers.placed, gradient pairs in buffers.ordered), splitting only `allowed`
   * columns (null: all). Leaves the tree in the shared tables (goesRight,
   * nodeColumn, leafValue) for the next gradient round to add to the scores.
   */
  async grow(rootCount: number, allowed: Uint8Array | null): Promise<GrownTree> {
    const { settings, buffers, layout } = this;
    const internal = 2 ** settings.depth - 1;
    const tree: TreeArrays = {
      column: new Int32Array(internal).fill(-1),
      threshold: new Int32Array(internal),
      missingRight: new Uint8Array(internal),
      rightBins: new Array<Uint8Array | null>(internal).fill(null),
      gain: new Float64Array(internal),
      cover: new Float64Array(internal),
    };
    const grownLeaves: { node: number; depth: number; value: number }[] = [];
    const addLeaf = (node: number, depth: number, gradient: number, hessian: number): void => {
      const d = hessian + settings.l2;
      const value = d > 0 ? (-gradient / d) * settings.learningRate : 0;
      grownLeaves.push({ node, depth, value });
    };
    this.clearTables();

    let level = [await this.root(rootCount)];
    let leafCount = 1;
    while (level.length > 0) {
      const candidates: Split[] = [];
      for (const node of level) {
        if (node.hist === null || !this.canSplit(node.depth, node)) continue;
        const choice = findBestSplit(
          node.hist,
          layout,
          allowed,
          node.gradient,
          node.hessian,
          settings,
        );
        if (choice !== null) candidates.push({ node, choice });
      }
      candidates.sort((a, b) => b.choice.gain - a.choice.gain || a.node.id - b.node.id);
      const accepted = candidates.slice(0, Math.max(0, settings.leaves - leafCount));
      leafCount += accepted.length;
      const more = leafCount < settings.leaves;
      const splitIds = new Set(accepted.map((a) => a.node.id));
      for (const node of level) {
        if (splitIds.has(node.id)) continue;
        addLeaf(node.id, node.depth, node.gradient, node.hessian);
      }
      const partitioned: Split[] = [];
      for (const split of accepted) {
        const { node, choice } = split;
        this.record(tree, split);
        const depth = node.depth + 1;
        // Row counts are known after the partition; until then the hessians decide.
        const left = { count: 2, hessian: choice.left.hessian };
        const right = { count: 2, hessian: choice.right.hessian };
        if (more && (this.canSplit(depth, left) || this.canSplit(depth, right))) {
          partitioned.push(split);
          continue;
        }
        addLeaf(2 * node.id + 1, depth, choice.left.gradient, choice.left.hessian);
        addLeaf(2 * node.id + 2, depth, choice.right.gradient, choice.right.hessian);
      }
      const parents = level;
      level = await this.nextLevel(partitioned);
      this.histograms.release(...parents, ...level.filter((n) => !this.canSplit(n.depth, n)));
    }
    let depth = 0;
    for (const leaf of grownLeaves) depth = Math.max(depth, leaf.depth);
    grownLeaves.sort((a, b) => a.node - b.node);
    // Leaves above the full depth sit on the leftmost leaf below them; pass-through nodes go left.
    buffers.leafValue.fill(0, 0, 2 ** depth);
    for (const leaf of grownLeaves) {
      const position = leaf.node - (2 ** leaf.depth - 1);
      buffers.leafValue[position * 2 ** (depth - leaf.depth)] = leaf.value;
    }
    // Keep only the levels the tree reached: a forest holds many trees.
    const used = 2 ** depth - 1;
    const grown: GrownTree = {
      depth,
      column: tree.column.slice(0, used),
      threshold: tree.threshold.slice(0, used),
      missingRight: tree.missingRight.slice(0, used),
      rightBins: tree.rightBins.slice(0, used),
      gain: tree.gain.slice(0, used),
      cover: tree.cover.slice(0, used),
      leaves: grownLeaves,
    };
    return grown;
  }

  /** The root node with its histogram and gradient totals. */
  private async root(count: number): Promise<GrowNode> {
    const segments: number[] = [];
    for (let s = 0; s < count; s += this.buffers.blockRows) {
      segments.push(s, Math.min(s + this.buffers.blockRows, count));
    }
    const root: GrowNode = {
      id: 0,
      depth: 0,
      segments,
      count,
      gradient: 0,
      hessian: 0,
      hist: null,
    };
    let gradient = 0;
    let hessian = 0;
    if (this.layout.columnCount > 0) {
      const ready = this.buffers.rootHistBlocks[0];
      this.buffers.rootHistBlocks[0] = 0;
      // The gradient round sums the root histogram when the tree has every training row.
      if (ready > 0) root.hist = this.histograms.collect(0, ready);
      else await this.histograms.build([root]);
      // Column 0 holds every row once (value bins and the missing bin).
      const hist = root.hist as Float64Array;
      for (let k = 0; k < SLOT_VALUES * (this.layout.valueBins[0] + 1); k += SLOT_VALUES) {
        gradient += hist[k];
        hessian += hist[k + 1];
      }
    } else {
      const ordered = this.buffers.ordered;
      for (let i = 0; i < count; i++) {
        gradient += ordered[2 * i];
        hessian += ordered[2 * i + 1];
      }
    }
    return { ...root, gradient, hessian };
  }

  /** Partitions the split nodes and gives their children the histograms they need. */
  private async nextLevel(splits: readonly Split[]): Promise<GrowNode[]> {
    const children = await partitionNodes(this.pool, this.buffers, this.histograms, splits);
    children.forEach(([left, right], i) => {
      const small = left.hist !== null ? left : right;
      const large = small === left ? right : left;
      if (this.canSplit(large.depth, large)) {
        large.hist = this.histograms.subtract(splits[i].node, small);
      }
    });
    return children.flat();
  }

  /** Writes a split into the tree and into the shared tables the workers read. */
  private record(tree: TreeArrays, { node, choice }: Split): void {
    const id = node.id;
    tree.column[id] = choice.column;
    tree.threshold[id] = choice.threshold;
    tree.missingRight[id] = choice.missingRight ? 1 : 0;
    tree.rightBins[id] = choice.rightBins;
    tree.gain[id] = choice.gain;
    tree.cover[id] = node.hessian;
    writeSplitTable(choice, this.layout.valueBins[choice.column], this.buffers.goesRight, 256 * id);
    this.buffers.nodeColumn[id] = choice.column;
    this.written.push(id);
  }

  /** Whether a node at `depth` with these rows could still split. */
  private canSplit(depth: number, stats: { count: number; hessian: number }): boolean {
    return (
      depth < this.settings.depth &&
      stats.count >= 2 &&
      stats.hessian >= 2 * this.settings.minLeafHessian
    );
  }

  /** Resets the split tables of the previous tree's nodes to pass-through. */
  private clearTables(): void {
    for (const id of this.written) {
      this.buffers.goesRight.fill(0, 256 * id, 256 * id + 256);
      this.buffers.nodeColumn[id] = 0;
    }
    this.written = [];
  }
}
