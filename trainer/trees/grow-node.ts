/**
 * A node while its tree grows: its rows as [start, end) segments of positions
 * (in order; see buffers.placed), their gradient and hessian sums, and its histogram
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
