/**
 * Reuses node histograms (Float64Array of one size) across nodes and trees, so
 * growing a tree allocates nothing once the pool has warmed up. Histograms taken
 * from the pool hold stale numbers: the caller overwrites every entry.
 *
 * @example
 * const pool = new HistogramPool(3 * 256);
 * const hist = pool.take();
 * pool.give(hist);
 */
export class HistogramPool {
  private readonly free: Float64Array[] = [];

  constructor(private readonly size: number) {}

  take(): Float64Array {
    return this.free.pop() ?? new Float64Array(this.size);
  }

  give(hist: Float64Array): void {
    this.free.push(hist);
  }
}
