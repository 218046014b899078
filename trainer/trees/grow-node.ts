/**
 * A node while its tree grows: its rows as [start, end) segments of
 * buffers.rows (in order), their gradient and hessian sums, and its histogram
 * once built (null for nodes that will not split).
 */
export interface GrowNode {
  /** Index in the implicit complete layout: children of i are 2i + 1 and 2i + 2. */
  readonly id: number;
  readonly depth: number;
  readonly segments: readonly number[];
  readonly count: number;
  readonly gradient: number;
  readonly hessian: number;
  hist: Float64Array | null;
}

/**
 * Rows that end in leaves, as segments of buffers.rows: a leaf's own rows
 * (column -1; value nodeValue[node]), or the rows of a split node whose two
 * children are leaves (its split column; values of nodes 2 node + 1, 2 node + 2).
 */
export interface LeafRange {
  readonly segments: readonly number[];
  readonly node: number;
  readonly column: number;
}
