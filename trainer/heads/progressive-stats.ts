import { sharedFloat64 } from "./shared-float64.js";

/** Per head and slice: weighted log-loss sum, weight sum, weighted predicted sum, weighted positives, rows. */
export const STAT_FIELDS = 5;
export const STAT_LOSS = 0;
export const STAT_WEIGHT = 1;
export const STAT_PREDICTED = 2;
export const STAT_POSITIVE = 3;
export const STAT_ROWS = 4;

/**
 * Progressive-validation sums of a head state (McMahan et al. 2013: every row is
 * scored before it is trained on), over all rows and per time slice. The sums are
 * enough for mean log loss, normalized entropy and calibration (He et al. 2014);
 * see progressive-report.ts. The training kernels add to these arrays directly,
 * row by row, so the sums do not depend on how the stream was cut into batches.
 *
 * Slices are numbered floor(timestamp / sliceMs) and get a slot in order of first
 * appearance; `sliceStats` is [slot][head][STAT_FIELDS] with spare capacity.
 *
 * @example
 * const stats = new ProgressiveStats(6, 24);
 * const slots = new Int32Array(batch.rowCount);
 * stats.assignSlots(batch.timestamps, batch.rowCount, slots);
 */
export class ProgressiveStats {
  readonly headCount: number;
  readonly sliceMs: number;
  /** [head][STAT_FIELDS] over every row seen. */
  readonly overall: Float64Array;
  /** [slot][head][STAT_FIELDS]; replaced by a larger copy when slices outgrow it. */
  sliceStats: Float64Array;
  /** Per slot, the slice number floor(timestamp / sliceMs). */
  private readonly indexes: number[] = [];
  private readonly slotByIndex = new Map<number, number>();

  constructor(headCount: number, sliceHours: number) {
    this.headCount = headCount;
    this.sliceMs = sliceHours * 3_600_000;
    this.overall = sharedFloat64(headCount * STAT_FIELDS);
    this.sliceStats = sharedFloat64(8 * headCount * STAT_FIELDS);
  }

  /** Number of slices seen so far. */
  get sliceCount(): number {
    return this.indexes.length;
  }

  /** Per slot, the slice number floor(timestamp / sliceMs), in slot order. */
  get sliceIndexes(): readonly number[] {
    return this.indexes;
  }

  /** How many slices `sliceStats` can hold. */
  get sliceCapacity(): number {
    return this.sliceStats.length / (this.headCount * STAT_FIELDS);
  }

  /** Start of a slot's slice, in milliseconds since the Unix epoch. */
  sliceStart(slot: number): number {
    const index = this.indexes[slot];
    if (index === undefined) throw new RangeError(`progressive: no slice slot ${slot}`);
    return index * this.sliceMs;
  }

  /**
   * Writes each row's slice slot into `out` (-1 for a missing timestamp) and
   * registers slices not seen before. It does not grow `sliceStats` (a worker may
   * be writing to it); call ensureCapacity once no kernel runs.
   */
  assignSlots(timestamps: Float64Array, rowCount: number, out: Int32Array): void {
    let lastIndex = Number.NaN;
    let lastSlot = -1;
    for (let r = 0; r < rowCount; r++) {
      const t = timestamps[r];
      if (!Number.isFinite(t)) {
        out[r] = -1;
        continue;
      }
      const index = Math.floor(t / this.sliceMs);
      if (index !== lastIndex) {
        lastIndex = index;
        lastSlot = this.slotOf(index);
      }
      out[r] = lastSlot;
    }
  }

  /** Replaces `sliceStats` by a larger copy when the registered slices outgrow it; true when it did. */
  ensureCapacity(): boolean {
    if (this.indexes.length <= this.sliceCapacity) return false;
    let capacity = this.sliceCapacity;
    while (capacity < this.indexes.length) capacity *= 2;
    const grown = sharedFloat64(capacity * this.headCount * STAT_FIELDS);
    grown.set(this.sliceStats);
    this.sliceStats = grown;
    return true;
  }

  /** Restores sums saved by a previous run (head-state file). */
  restore(overall: Float64Array, indexes: readonly number[], sliceStats: Float64Array): void {
    this.overall.set(overall);
    for (const index of indexes) this.slotOf(index);
    this.ensureCapacity();
    this.sliceStats.set(sliceStats);
  }

  private slotOf(index: number): number {
    let slot = this.slotByIndex.get(index);
    if (slot === undefined) {
      slot = this.indexes.length;
      this.slotByIndex.set(index, slot);
      this.indexes.push(index);
    }
    return slot;
  }
}
