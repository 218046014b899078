import type { BinnedFeatures } from "./binned-features.js";
import { writeSplitTable } from "./find-best-split.js";
import type { GrownTree } from "./grown-tree.js";
import { addTreeToScores } from "./add-tree-to-scores.js";
import { damagedCheckpointError } from "../io/damaged-checkpoint-error.js";

const NO_CHILD = { gradient: 0, hessian: 0, count: 0 };

/**
 * The raw scores of every binned row under a checkpoint's trees: `base` plus
 * each tree's leaf value, added in tree order by the kernel fitting uses
 * (addTreeToScores: one addition per row and tree), so the scores come back
 * bit for bit and fitting continues as if it had never stopped. The trees are
 * checked against the binned layout first: a damaged checkpoint must not read
 * outside the arrays.
 *
 * @example
 * rebuildCheckpointScores(binned, forest.baseLogit, progress.trees, buffers.score);
 */
export function rebuildCheckpointScores(
  binned: BinnedFeatures,
  base: number,
  trees: readonly GrownTree[],
  score: Float64Array,
): void {
  const n = binned.rowCount;
  score.fill(base, 0, n);
  trees.forEach((tree, t) => {
    const internal = 2 ** tree.depth - 1;
    const goesRight = new Uint8Array(256 * Math.max(1, internal));
    const nodeColumn = new Int32Array(Math.max(1, internal));
    for (let i = 0; i < internal; i++) {
      const column = tree.column[i];
      if (column < 0) continue;
      const valueBins = binned.valueBins[column];
      const categorical = binned.columnCategorical[column] === 1;
      const rightBins = tree.rightBins[i];
      if (
        column >= binned.columnCount ||
        categorical !== (rightBins !== null) ||
        (!categorical && (tree.threshold[i] < 0 || tree.threshold[i] >= valueBins)) ||
        (rightBins !== null && rightBins.some((b) => b >= valueBins))
      ) {
        throw damagedCheckpointError(
          `tree ${t + 1} node ${i}: expected a split on one of ${binned.columnCount} binned columns within its bins`,
        );
      }
      const choice = {
        column,
        gain: 0,
        threshold: tree.threshold[i],
        missingRight: tree.missingRight[i] === 1,
        rightBins,
        left: NO_CHILD,
        right: NO_CHILD,
      };
      writeSplitTable(choice, valueBins, goesRight, 256 * i);
      nodeColumn[i] = column;
    }
    // Leaves above the full depth sit on the leftmost leaf below them; pass-through nodes go left.
    const leafValue = new Float64Array(2 ** tree.depth);
    for (const leaf of tree.leaves) {
      const position = leaf.node - (2 ** leaf.depth - 1);
      leafValue[position * 2 ** (tree.depth - leaf.depth)] = leaf.value;
    }
    addTreeToScores(
      binned.bins,
      binned.columnCount,
      0,
      n,
      tree.depth,
      nodeColumn,
      goesRight,
      leafValue,
      score,
    );
  });
}
