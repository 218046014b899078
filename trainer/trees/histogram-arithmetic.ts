/**
 * Whole-histogram kernels of the main thread: merging block histograms and
 * deriving a larger sibling by subtraction. Kept as small standalone functions
 * so that they are optimized after a few calls. No checks, no allocation.
 */

/**
 * target[k] += source[offset + k] for k < target.length.
 *
 * @example
 * addHistogram(nodeHist, blockHist, 2 * histSize); // adds block 2
 */
export function addHistogram(target: Float64Array, source: Float64Array, offset: number): void {
  const n = target.length;
  for (let k = 0; k < n; k++) target[k] += source[offset + k];
}

/**
 * target[k] = parent[k] - child[k]: the sibling's histogram.
 *
 * @example
 * subtractHistogram(largeHist, parentHist, smallHist);
 */
export function subtractHistogram(
  target: Float64Array,
  parent: Float64Array,
  child: Float64Array,
): void {
  const n = target.length;
  for (let k = 0; k < n; k++) target[k] = parent[k] - child[k];
}
