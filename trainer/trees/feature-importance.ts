import type { BinnedFeatures } from "./binned-features.js";
import type { GrownTree } from "./grown-tree.js";

/** How much a forest relies on one feature. */
export interface FeatureImportance {
  readonly feature: string;
  /** Sum of the split gains (see findBestSplit) over the feature's splits. */
  readonly gain: number;
  /** Sum of the hessians of the nodes it split (the weight of rows it decided on). */
  readonly cover: number;
  readonly splits: number;
}

/**
 * Importance by total gain, cover and split count of every contract feature,
 * in contract order (features never split on have zeros).
 *
 * @example
 * featureImportance(trees, binned).sort((a, b) => b.gain - a.gain)[0].feature; // most useful feature
 */
export function featureImportance(
  trees: readonly GrownTree[],
  binned: BinnedFeatures,
): FeatureImportance[] {
  const names = [...binned.contract.numeric, ...binned.contract.categorical.map((c) => c.name)];
  const gain = new Float64Array(names.length);
  const cover = new Float64Array(names.length);
  const splits = new Float64Array(names.length);
  for (const tree of trees) {
    for (let i = 0; i < tree.column.length; i++) {
      const column = tree.column[i];
      if (column < 0) continue;
      const f = binned.columnFeature[column];
      gain[f] += tree.gain[i];
      cover[f] += tree.cover[i];
      splits[f]++;
    }
  }
  return names.map((feature, f) => ({
    feature,
    gain: gain[f],
    cover: cover[f],
    splits: splits[f],
  }));
}
