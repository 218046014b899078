/**
 * Kernels that move the raw scores (log-odds) after a tree is grown.
 * No checks, no allocation.
 */

/**
 * Adds one leaf's value to the scores of its rows rows[start .. end).
 *
 * @example
 * addLeafValue(Uint32Array.of(2, 5), 0, 2, score, 0.1); // score[2] += 0.1; score[5] += 0.1
 */
export function addLeafValue(
  rows: Uint32Array,
  start: number,
  end: number,
  score: Float64Array,
  value: number,
): void {
  for (let i = start; i < end; i++) score[rows[i]] += value;
}

/**
 * Adds to each row of rows[start .. end) the value of the child it goes to under
 * node's split: nodeValue[2 node + 1] (left) or nodeValue[2 node + 2] (right); the
 * split column's bin is read by position from `placed` (see partitionRows). For
 * a split whose children are both final leaves this replaces partitioning the
 * rows and then adding each leaf's value.
 *
 * @example
 * addSplitValues(placed, stride, rows, 0, 1000, column, node, goesRight, nodeValue, score);
 */
export function addSplitValues(
  placed: Uint8Array,
  stride: number,
  rows: Uint32Array,
  start: number,
  end: number,
  column: number,
  node: number,
  goesRight: Uint8Array,
  nodeValue: Float64Array,
  score: Float64Array,
): void {
  const table = 256 * node;
  const left = 2 * node + 1;
  for (let i = start; i < end; i++) {
    score[rows[i]] += nodeValue[left + goesRight[table + placed[i * stride + column]]];
  }
}

/**
 * Sends rows[start .. end) down one binned tree in the implicit complete layout
 * (children of node i are 2i + 1 and 2i + 2) and adds the reached leaf's value.
 * Pass-through nodes have an all-zero table, so they always go left.
 *
 * @example
 * addTreeByTraversal(bins, columnCount, rows, 0, rows.length, 6, nodeColumn, goesRight, leafValue, score);
 */
export function addTreeByTraversal(
  bins: Uint8Array,
  columnCount: number,
  rows: Uint32Array,
  start: number,
  end: number,
  depth: number,
  nodeColumn: Int32Array,
  goesRight: Uint8Array,
  leafValue: Float64Array,
  score: Float64Array,
): void {
  const firstLeaf = (1 << depth) - 1;
  for (let i = start; i < end; i++) {
    const r = rows[i];
    const at = r * columnCount;
    let node = 0;
    for (let d = 0; d < depth; d++) {
      node = 2 * node + 1 + goesRight[node * 256 + bins[at + nodeColumn[node]]];
    }
    score[r] += leafValue[node - firstLeaf];
  }
}
