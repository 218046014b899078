import { LeafcastError, type Issue } from "../errors.js";
import {
  checkCounts,
  PSI_EPSILON,
  psiKernel,
  type BinCounts,
} from "./population-stability-index.js";

/** Leaf PSI of one forest: per tree, and the forest figures built from them. */
export interface LeafPsi {
  /** PSI of each tree's leaf shares, fit window against new window. */
  readonly perTree: Float64Array;
  /**
   * The forest's PSI: the mean of the per-tree values. A mean keeps the per-tree scale,
   * so the usual 0.10 / 0.25 reading applies to a forest of any size (a sum would grow
   * with the tree count); the PSI of the joint leaf pattern is not recoverable from
   * per-tree counts.
   */
  readonly forest: number;
  /** The largest per-tree PSI and its tree, so one badly shifted tree is not averaged away. */
  readonly max: number;
  readonly maxTree: number;
}

/**
 * Tree staleness as leaf PSI: for each tree, the share of rows reaching each leaf in
 * the trees' fit window (expected) against a new window (actual). Counts are laid out
 * [tree][leaf], `leavesPerTree` per tree (2^depth in the implicit layout); leaves
 * empty in both windows add nothing (see PSI_EPSILON).
 *
 * @example
 * // two trees of two leaves
 * const psi = leafPsi(Float64Array.of(50, 50, 90, 10), Float64Array.of(50, 50, 60, 40), 2);
 * // psi.perTree = [0, 0.5375...], psi.forest = 0.2688..., psi.maxTree = 1
 */
export function leafPsi(
  fitCounts: BinCounts,
  newCounts: BinCounts,
  leavesPerTree: number,
  epsilon = PSI_EPSILON,
): LeafPsi {
  const issues: Issue[] = [];
  if (!(Number.isInteger(leavesPerTree) && leavesPerTree >= 1)) {
    issues.push({
      code: "leaves_per_tree",
      message: `leafPsi: leaves per tree expected a whole number >= 1, found ${leavesPerTree}`,
    });
  } else if (fitCounts.length % leavesPerTree !== 0 || fitCounts.length === 0) {
    issues.push({
      code: "length_mismatch",
      message: `leafPsi: fit-window counts expected a positive multiple of ${leavesPerTree} entries, found ${fitCounts.length}`,
    });
  }
  if (newCounts.length !== fitCounts.length) {
    issues.push({
      code: "length_mismatch",
      message: `leafPsi: new-window counts expected ${fitCounts.length} entries (as the fit window), found ${newCounts.length}`,
    });
  }
  if (!(epsilon > 0 && epsilon < 1)) {
    issues.push({
      code: "bad_epsilon",
      message: `leafPsi: epsilon expected a number in (0, 1), found ${epsilon}`,
    });
  }
  if (issues.length > 0) throw new LeafcastError("metrics", issues);

  const trees = fitCounts.length / leavesPerTree;
  for (let t = 0; t < trees && issues.length < 10; t++) {
    checkCounts(issues, "fit-window", fitCounts, t * leavesPerTree, leavesPerTree, ` of tree ${t}`);
    checkCounts(issues, "new-window", newCounts, t * leavesPerTree, leavesPerTree, ` of tree ${t}`);
  }
  if (issues.length > 0) throw new LeafcastError("metrics", issues);

  const perTree = new Float64Array(trees);
  let sum = 0;
  let max = -Infinity;
  let maxTree = 0;
  for (let t = 0; t < trees; t++) {
    const psi = psiKernel(fitCounts, newCounts, t * leavesPerTree, leavesPerTree, epsilon);
    perTree[t] = psi;
    sum += psi;
    if (psi > max) {
      max = psi;
      maxTree = t;
    }
  }
  return { perTree, forest: sum / trees, max, maxTree };
}
