/**
 * Trees per pass of the heads kernel (see sumLeafWeights): as many as keep the
 * pass's leaf weights (leaves x lanes doubles per tree) within about 256 KiB, so
 * they stay in cache while every row of a chunk reads them (for 1000 trees of
 * depth 8 this halved the heads' time here).
 *
 * @example
 * treeGroup(64, 6); // 85 trees of depth 6 for six heads
 * treeGroup(256, 6); // 21 trees of depth 8
 */
export function treeGroup(leavesPerTree: number, lanes: number): number {
  return Math.max(1, Math.floor(32768 / (leavesPerTree * lanes)));
}
