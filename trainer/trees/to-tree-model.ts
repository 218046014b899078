import type { TreeModel } from "../../scorer/model-types.js";
import type { BinnedFeatures } from "./binned-features.js";
import type { GrownTree } from "./grown-tree.js";

/**
 * Turns a tree grown in bins into the scorer's TreeModel at `depth` (>= the
 * tree's own depth): contract feature indexes, raw thresholds (the bin's upper
 * edge, so "x > threshold goes right" sends every raw value where its bin went),
 * category codes that go right, and leaf values placed on the leftmost leaf
 * under each grown leaf, reached through pass-through nodes (feature -1).
 *
 * @example
 * const model = toTreeModel(tree, binned, 6);
 * model.leafValue.length; // 64
 */
export function toTreeModel(tree: GrownTree, binned: BinnedFeatures, depth: number): TreeModel {
  const internal = 2 ** depth - 1;
  const feature = new Int32Array(internal).fill(-1);
  const threshold = new Float64Array(internal);
  const missingRight = new Uint8Array(internal);
  const rightCategories: (Int32Array | null)[] = new Array<Int32Array | null>(internal).fill(null);
  const grown = Math.min(internal, tree.column.length);
  for (let i = 0; i < grown; i++) {
    const column = tree.column[i];
    if (column < 0) continue;
    feature[i] = binned.columnFeature[column];
    missingRight[i] = tree.missingRight[i];
    const edges = binned.edges[column];
    if (edges === null) {
      rightCategories[i] = Int32Array.from(tree.rightBins[i] ?? []);
    } else {
      threshold[i] = edges[tree.threshold[i]];
    }
  }
  const leafValue = new Float64Array(2 ** depth);
  for (const leaf of tree.leaves) {
    const position = leaf.node - (2 ** leaf.depth - 1);
    leafValue[position * 2 ** (depth - leaf.depth)] = leaf.value;
  }
  return { feature, threshold, missingRight, rightCategories, leafValue };
}
