/**
 * The part of a head state that one thread updates: some heads, within arrays
 * laid out [coordinate][stride] (z, n) and [slot][stride][STAT_FIELDS] (sums),
 * the block's heads at positions offset .. offset + heads.length - 1. A block
 * may view the state's own arrays (stride = all heads) or its own copies
 * (stride = its heads, offset 0), which share no cache line with other threads'
 * blocks (see split-head-blocks.ts).
 */
export interface HeadBlock {
  /** Global head index of each block head, ascending and consecutive. */
  readonly heads: Int32Array;
  /** Heads per coordinate in the arrays. */
  readonly stride: number;
  /** Position of the block's first head within a coordinate. */
  readonly offset: number;
  readonly z: Float64Array;
  readonly n: Float64Array;
  /** [head][STAT_FIELDS], `stride` heads */
  readonly overall: Float64Array;
  /** [slot][head][STAT_FIELDS], `stride` heads per slot */
  readonly sliceStats: Float64Array;
}

/** The FTRL-Proximal and downsampling settings a training kernel applies. */
export interface FtrlRule {
  readonly alpha: number;
  readonly beta: number;
  readonly lambda1: number;
  readonly lambda2: number;
  /** Coordinate of the bias (the encoded index-space size). */
  readonly biasCoordinate: number;
  readonly seed: number;
  /** Per global head: share of negatives kept. */
  readonly keepRate: Float64Array;
  /** true: kept negatives weigh 1/rate ("weight"); false: serve with q = recalibrate(p) ("recalibrate"). */
  readonly weightNegatives: boolean;
}

/** One batch in the flat form every training thread reads (shared memory in worker runs). */
export interface KernelBatch {
  readonly rowCount: number;
  readonly offsets: Uint32Array;
  readonly index: Int32Array;
  readonly value: Float64Array | null;
  /** [globalHead][row] 0/1 labels. */
  readonly labels: Uint8Array;
  readonly weights: Float64Array | null;
  /** Per row slice slot, or null when the data has no timestamps. */
  readonly slots: Int32Array | null;
  /** Global number of the batch's first row. */
  readonly rowBase: number;
  /** Longest row (entries), for sizing scratch space. */
  readonly maxRowLength: number;
}
