import { columnsFromItems } from "./columns-from-items.js";
import type { ScoreItem } from "./score-item.js";
import type { Scorer } from "./scorer.js";

/** Nanoseconds per call, as a distribution. */
export interface LatencyDistribution {
  readonly p50: number;
  readonly p90: number;
  readonly p99: number;
  readonly p999: number;
  readonly max: number;
  readonly mean: number;
  readonly samples: number;
}

/** What measureLatency found. Times in nanoseconds. */
export interface LatencyReport {
  readonly items: number;
  /** One scoreOne call per sample; `trees` times traverseOne (reading the item and walking the trees, no heads). */
  readonly single: {
    readonly total: LatencyDistribution;
    readonly trees: LatencyDistribution;
    /** total.p50 - trees.p50: hashing, head sums, sigmoid and calibration. */
    readonly headsP50: number;
  };
  /** scoreBatch over the items as one columnar batch, into reused outputs; `trees` times traverseBatch. */
  readonly batch: {
    readonly nsPerItem: number;
    readonly treesNsPerItem: number;
    readonly headsNsPerItem: number;
  };
  /** The clock's cost per reading (subtracted from every single-call sample) and its finest step seen. */
  readonly timer: { readonly overheadNs: number; readonly resolutionNs: number };
}

/** How measureLatency runs. */
export interface LatencyOptions {
  /** Untimed scoreOne calls first, so the JIT has compiled the hot paths. Default 2000. */
  readonly warmup?: number;
  /** Timed passes over the items (single calls and batches). Default 5. */
  readonly repetitions?: number;
  /** Milliseconds from some origin; default performance.now (microsecond-or-better in Node; coarser in browsers). */
  readonly now?: () => number;
}

/**
 * Measures the scorer on the given items: the latency distribution of
 * single-item calls (p50, p90, p99, p99.9, max) and the batch cost per item, each
 * split into tree traversal and heads. Runs on the calling thread; a busy
 * machine shows in the tail.
 *
 * @example
 * const report = measureLatency(scorer, items, { warmup: 2000, repetitions: 5 });
 * report.single.total.p50; // e.g. 1900 (ns)
 */
export function measureLatency(
  scorer: Scorer,
  items: readonly ScoreItem[],
  options: LatencyOptions = {},
): LatencyReport {
  if (items.length === 0) throw new RangeError("latency: expected at least one item, found none");
  const now = options.now ?? (() => performance.now());
  const repetitions = Math.max(1, options.repetitions ?? 5);
  const warmup = Math.max(0, options.warmup ?? 2000);
  const leaves = new Int32Array(scorer.layout.treeCount);
  const batch = columnsFromItems(scorer.features, items);
  for (let i = 0; i < warmup; i++) {
    scorer.scoreOne(items[i % items.length]);
    scorer.traverseOne(items[i % items.length], leaves);
  }
  scorer.scoreBatch(batch);
  scorer.traverseBatch(batch);
  const timer = timerCost(now);
  const samples = repetitions * items.length;
  const total = new Float64Array(samples);
  const trees = new Float64Array(samples);
  for (let s = 0; s < samples; s++) {
    const item = items[s % items.length];
    const t0 = now();
    scorer.scoreOne(item);
    total[s] = (now() - t0) * 1e6 - timer.overheadNs;
  }
  for (let s = 0; s < samples; s++) {
    const item = items[s % items.length];
    const t0 = now();
    scorer.traverseOne(item, leaves);
    trees[s] = (now() - t0) * 1e6 - timer.overheadNs;
  }
  // Outputs are reused, as a serving loop would: fresh arrays cost page faults, not scoring.
  const outputs = scorer.allocateScores(items.length);
  const batchLeaves = new Int32Array(items.length * scorer.layout.treeCount);
  const batchTimes: number[] = [];
  const treeTimes: number[] = [];
  for (let r = 0; r < repetitions; r++) {
    let t0 = now();
    scorer.scoreBatch(batch, outputs);
    batchTimes.push(((now() - t0) * 1e6) / items.length);
    t0 = now();
    scorer.traverseBatch(batch, batchLeaves);
    treeTimes.push(((now() - t0) * 1e6) / items.length);
  }
  const totalDistribution = distribution(total);
  const treesDistribution = distribution(trees);
  const nsPerItem = median(batchTimes);
  const treesNsPerItem = median(treeTimes);
  return {
    items: items.length,
    single: {
      total: totalDistribution,
      trees: treesDistribution,
      headsP50: Math.max(0, totalDistribution.p50 - treesDistribution.p50),
    },
    batch: { nsPerItem, treesNsPerItem, headsNsPerItem: Math.max(0, nsPerItem - treesNsPerItem) },
    timer,
  };
}

function timerCost(now: () => number): { overheadNs: number; resolutionNs: number } {
  const gaps: number[] = [];
  let resolution = Infinity;
  for (let i = 0; i < 2000; i++) {
    const a = now();
    const b = now();
    const gap = (b - a) * 1e6;
    gaps.push(gap);
    if (gap > 0 && gap < resolution) resolution = gap;
  }
  return { overheadNs: median(gaps), resolutionNs: Number.isFinite(resolution) ? resolution : 0 };
}

function distribution(samples: Float64Array): LatencyDistribution {
  const sorted = Float64Array.from(samples, (v) => Math.max(0, v)).sort();
  const at = (q: number): number =>
    sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1))];
  let sum = 0;
  for (const v of sorted) sum += v;
  return {
    p50: at(0.5),
    p90: at(0.9),
    p99: at(0.99),
    p999: at(0.999),
    max: sorted[sorted.length - 1],
    mean: sum / sorted.length,
    samples: sorted.length,
  };
}

function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}
