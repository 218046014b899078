import type { EncodedLayout } from "./encoded-layout.js";
import type { HeadModel } from "./model-types.js";

/**
 * The heads laid out for scoring: every table is [entry][lane] with one lane per
 * head (padded to 2, 4, 6, 8 or a multiple of 8 lanes), so one pass over an item's leaves
 * serves every head from the same cache lines.
 */
export interface CompiledHeads {
  readonly outcomes: readonly string[];
  readonly headCount: number;
  /** Doubles per table row: heads rounded up to 2, 4, 6 or 8, beyond 8 heads to a multiple of 8. */
  readonly lanes: number;
  /** Per leaf slot of the encoded space: the heads' weights. */
  readonly leafWeight: Float64Array;
  /** Open-addressing table of hashed buckets with a weight in some head: bucket (relative to the hashed region) or -1. */
  readonly bucketKey: Int32Array;
  /** Row of `hashedWeight` for each occupied `bucketKey` entry. */
  readonly bucketRow: Int32Array;
  readonly hashedWeight: Float64Array;
  /** Per standardized slot: the heads' weights. */
  readonly numericWeight: Float64Array;
  readonly bias: Float64Array;
  readonly negativeKeepRate: Float64Array;
  readonly valueWeight: Float64Array;
}

/**
 * Lays out checked heads (see checkScoringModel) for the scoring kernels.
 *
 * @example
 * const heads = compileHeads(model.heads, model.valueWeights, encodedLayout(model.forests, model.encoding));
 * heads.lanes; // 6 for 6 heads
 */
export function compileHeads(
  heads: readonly HeadModel[],
  valueWeights: readonly number[],
  layout: EncodedLayout,
): CompiledHeads {
  const headCount = heads.length;
  // Exact lanes save memory traffic (the leaf table is the hot data): round up to even up to 8.
  const lanes =
    headCount <= 8 ? Math.max(2, 2 * Math.ceil(headCount / 2)) : 8 * Math.ceil(headCount / 8);
  const leafWeight = new Float64Array(layout.leafCount * lanes);
  const numericCount = layout.width - layout.numericOffset;
  const numericWeight = new Float64Array(numericCount * lanes);
  const buckets = new Set<number>();
  for (const head of heads) {
    for (const index of head.index) {
      if (index >= layout.hashedOffset && index < layout.numericOffset)
        buckets.add(index - layout.hashedOffset);
    }
  }
  let tableSize = 1;
  while (tableSize < 2 * buckets.size) tableSize *= 2;
  const bucketKey = new Int32Array(tableSize).fill(-1);
  const bucketRow = new Int32Array(tableSize);
  const hashedWeight = new Float64Array(buckets.size * lanes);
  let rows = 0;
  const rowOf = (bucket: number): number => {
    let at = bucket & (tableSize - 1);
    while (bucketKey[at] !== -1 && bucketKey[at] !== bucket) at = (at + 1) & (tableSize - 1);
    if (bucketKey[at] === -1) {
      bucketKey[at] = bucket;
      bucketRow[at] = rows++;
    }
    return bucketRow[at];
  };
  heads.forEach((head, h) => {
    for (let i = 0; i < head.index.length; i++) {
      const index = head.index[i];
      const weight = head.weight[i];
      if (index < layout.hashedOffset) leafWeight[index * lanes + h] = weight;
      else if (index < layout.numericOffset)
        hashedWeight[rowOf(index - layout.hashedOffset) * lanes + h] = weight;
      else numericWeight[(index - layout.numericOffset) * lanes + h] = weight;
    }
  });
  return {
    outcomes: heads.map((head) => head.outcome),
    headCount,
    lanes,
    leafWeight,
    bucketKey,
    bucketRow,
    hashedWeight,
    numericWeight,
    bias: Float64Array.from(heads, (head) => head.bias),
    negativeKeepRate: Float64Array.from(heads, (head) => head.negativeKeepRate),
    valueWeight: Float64Array.from(valueWeights),
  };
}
