import type { KernelBatch } from "./head-block.js";
import type { HeadBatch } from "./head-setup.js";
import { packLabels } from "./pack-labels.js";

/**
 * Shared-memory copies of batches for worker threads. The copy is a few hundred
 * bytes per row, cheap next to training on it, and lets the caller reuse or drop
 * its arrays at once. Buffers grow (doubling) and are reused across batches.
 *
 * @example
 * const kernelBatch = buffers.fill(batch, 6, rowBase, maxRowLength);
 * worker.postMessage({ batch: kernelBatch }); // views on SharedArrayBuffers: no copy
 */
export class SharedBatchBuffers {
  private offsets: Uint32Array = new Uint32Array(0);
  private index: Int32Array = new Int32Array(0);
  private value: Float64Array = new Float64Array(0);
  private labels: Uint8Array = new Uint8Array(0);
  private weights: Float64Array = new Float64Array(0);
  /** Filled by the caller (slice slots) after fill(), before posting. */
  slots: Int32Array = new Int32Array(0);

  fill(batch: HeadBatch, heads: number, rowBase: number, maxRowLength: number): KernelBatch {
    const { rowCount, offsets, index, value } = batch.encoded;
    const entries = offsets[rowCount];
    if (this.offsets.length < rowCount + 1) {
      const rows = grow(this.offsets.length, rowCount + 1);
      this.offsets = new Uint32Array(new SharedArrayBuffer(rows * 4));
      this.weights = new Float64Array(new SharedArrayBuffer(rows * 8));
      this.slots = new Int32Array(new SharedArrayBuffer(rows * 4));
    }
    if (this.labels.length < rowCount * heads) {
      this.labels = new Uint8Array(
        new SharedArrayBuffer(grow(this.labels.length, rowCount * heads)),
      );
    }
    if (this.index.length < entries) {
      this.index = new Int32Array(new SharedArrayBuffer(grow(this.index.length, entries) * 4));
    }
    if (value !== null && this.value.length < entries) {
      this.value = new Float64Array(new SharedArrayBuffer(grow(this.value.length, entries) * 8));
    }
    this.offsets.set(offsets.subarray(0, rowCount + 1));
    this.index.set(index.subarray(0, entries));
    if (value !== null) this.value.set(value.subarray(0, entries));
    packLabels(batch.labels, rowCount, this.labels);
    if (batch.weights !== null) this.weights.set(batch.weights.subarray(0, rowCount));
    return {
      rowCount,
      offsets: this.offsets.subarray(0, rowCount + 1),
      index: this.index.subarray(0, entries),
      value: value === null ? null : this.value.subarray(0, entries),
      labels: this.labels.subarray(0, rowCount * heads),
      weights: batch.weights === null ? null : this.weights.subarray(0, rowCount),
      slots: batch.timestamps === null ? null : this.slots.subarray(0, rowCount),
      rowBase,
      maxRowLength,
    };
  }
}

function grow(current: number, needed: number): number {
  return Math.max(needed, current * 2, 1024);
}
