/**
 * The reliability bin of a probability among `binCount` equal-width bins that are
 * open below and closed above, (k/B, (k+1)/B]; p = 0 goes to the first bin. The edge
 * k/B is computed as a division, and the product p * B is corrected by one bin when
 * rounding put it across that edge, so a p exactly on an edge always lands below it.
 *
 * @example
 * reliabilityBinIndex(0.5, 2); // 0: (0, 0.5]
 * reliabilityBinIndex(0.51, 2); // 1: (0.5, 1]
 * reliabilityBinIndex(0, 3); // 0
 */
export function reliabilityBinIndex(p: number, binCount: number): number {
  let k = Math.ceil(p * binCount) - 1;
  if (k < 0) k = 0;
  else if (k >= binCount) k = binCount - 1;
  if (k > 0 && p <= k / binCount) k--;
  else if (k < binCount - 1 && p > (k + 1) / binCount) k++;
  return k;
}
