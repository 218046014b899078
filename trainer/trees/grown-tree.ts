/**
 * One tree as the learner grew it, in bins, over the implicit complete layout
 * (node i has children 2i + 1 and 2i + 2). Internal-node arrays have
 * 2^depth - 1 entries for the depth the tree reached; nodes that did not split
 * have column -1.
 *
 * @example
 * tree.column[0]; // binned column of the root split, or -1 when the root is a leaf
 */
export interface GrownTree {
  /** Deepest level that holds a leaf (0 when the root never split). */
  readonly depth: number;
  readonly column: Int32Array;
  /** Numeric splits: value bins <= threshold go left. */
  readonly threshold: Int32Array;
  readonly missingRight: Uint8Array;
  /** Categorical splits: value bins that go right. */
  readonly rightBins: readonly (Uint8Array | null)[];
  /** Per split node: its gain and its hessian sum (cover). */
  readonly gain: Float64Array;
  readonly cover: Float64Array;
  /** The leaves: node index, its depth, and its value with the learning rate applied. */
  readonly leaves: readonly {
    readonly node: number;
    readonly depth: number;
    readonly value: number;
  }[];
}
