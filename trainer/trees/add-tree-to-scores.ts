/**
 * Sends rows start .. end - 1 (in row order) down one binned tree in the
 * implicit complete layout (children of node i are 2i + 1 and 2i + 2) and adds
 * the reached leaf's value to their raw scores. Pass-through nodes have an
 * all-zero table, so they always go left; a leaf above the full depth sits on
 * the leftmost leaf below it. Fitting scores every row this way after each tree
 * (fused into the gradient round, see runTreeTasks), training rows included: a
 * pass over row-major bins with the tables in L1 costs less than adding leaf
 * values through the partitioned row order, whose writes land at random rows
 * (about 7 against 24 to 38 ns per row in a probe here). Four rows go down
 * together: one row's walk is a chain of dependent loads, four chains overlap
 * (2.5 times faster than one row at a time in that probe). Kernel: no checks,
 * no allocation.
 *
 * @example
 * addTreeToScores(bins, columnCount, 0, rowCount, 6, nodeColumn, goesRight, leafValue, score);
 */
export function addTreeToScores(
  bins: Uint8Array,
  columnCount: number,
  start: number,
  end: number,
  depth: number,
  nodeColumn: Int32Array,
  goesRight: Uint8Array,
  leafValue: Float64Array,
  score: Float64Array,
): void {
  const firstLeaf = (1 << depth) - 1;
  let r = start;
  for (; r + 3 < end; r += 4) {
    const a0 = r * columnCount;
    const a1 = a0 + columnCount;
    const a2 = a1 + columnCount;
    const a3 = a2 + columnCount;
    let n0 = 0;
    let n1 = 0;
    let n2 = 0;
    let n3 = 0;
    for (let d = 0; d < depth; d++) {
      n0 = 2 * n0 + 1 + goesRight[(n0 << 8) + bins[a0 + nodeColumn[n0]]];
      n1 = 2 * n1 + 1 + goesRight[(n1 << 8) + bins[a1 + nodeColumn[n1]]];
      n2 = 2 * n2 + 1 + goesRight[(n2 << 8) + bins[a2 + nodeColumn[n2]]];
      n3 = 2 * n3 + 1 + goesRight[(n3 << 8) + bins[a3 + nodeColumn[n3]]];
    }
    score[r] += leafValue[n0 - firstLeaf];
    score[r + 1] += leafValue[n1 - firstLeaf];
    score[r + 2] += leafValue[n2 - firstLeaf];
    score[r + 3] += leafValue[n3 - firstLeaf];
  }
  for (; r < end; r++) {
    const at = r * columnCount;
    let node = 0;
    for (let d = 0; d < depth; d++) {
      node = 2 * node + 1 + goesRight[(node << 8) + bins[at + nodeColumn[node]]];
    }
    score[r] += leafValue[node - firstLeaf];
  }
}
