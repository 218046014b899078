import type { HeadBatch } from "./head-setup.js";

/**
 * Rows [from, to) of a batch, as a batch of their own: views of the labels,
 * weights, timestamps and encoded indexes, and offsets rebased to start at 0
 * (the only copy, to-from+1 numbers). learnHeads cuts batches where weight
 * snapshots fall.
 *
 * @example
 * const firstHalf = sliceHeadBatch(batch, 0, batch.encoded.rowCount >> 1);
 */
export function sliceHeadBatch(batch: HeadBatch, from: number, to: number): HeadBatch {
  const { offsets, index, value } = batch.encoded;
  const start = offsets[from];
  const end = offsets[to];
  const rebased = new Uint32Array(to - from + 1);
  for (let r = from; r <= to; r++) rebased[r - from] = offsets[r] - start;
  return {
    encoded: {
      rowCount: to - from,
      offsets: rebased,
      index: index.subarray(start, end),
      value: value === null ? null : value.subarray(start, end),
    },
    labels: batch.labels.map((y) => y.subarray(from, to)),
    weights: batch.weights === null ? null : batch.weights.subarray(from, to),
    timestamps: batch.timestamps === null ? null : batch.timestamps.subarray(from, to),
  };
}
