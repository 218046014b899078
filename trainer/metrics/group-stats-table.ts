import { binaryEntropy } from "./binary-entropy.js";
import { calibrationErrorOfBins } from "./calibration-error-of-bins.js";
import { histogramAuc } from "./histogram-auc.js";
import type { OutcomeSummary } from "./outcome-summary.js";
import type { ReliabilityBins } from "./reliability-bins.js";
import { reliabilityFromSums } from "./reliability-from-sums.js";
import { scoreHistogramBin } from "./score-histogram-bin.js";

/** Per group: rows, positives, weight, sum w p, sum w y, sum w loss, sum w (p - y)^2. */
const MOMENTS = 7;
/** Per reliability bin: rows, weight, sum w p, sum w y. */
const RELIABILITY = 4;

/** Per-row values computed once per batch and shared by every grouping. */
export interface PreparedRows {
  readonly length: number;
  readonly predicted: Float64Array;
  readonly label: Uint8Array;
  readonly weight: Float64Array | undefined;
  /** Unweighted log loss of the row (p clamped). */
  readonly loss: Float64Array;
  readonly reliabilityBin: Int32Array;
  /** ln(p / (1 - p)) of the clamped p, binned by each table at its own resolution. */
  readonly logit: Float64Array;
}

/**
 * The sums behind every metric, for a growing number of groups (time slices, segments),
 * the small sums of all groups in flat typed arrays at a fixed stride, and one score
 * histogram per group (a new group allocates its own, so growing never copies them).
 * Memory per group is 8 * (7 + 4 * reliabilityBins + 2 * aucBins) bytes: 64 KiB at
 * 2^12 AUC bins, 1 MiB at 2^16.
 *
 * @example
 * const table = new GroupStatsTable(10, 1 << 12);
 * const g = table.addGroup();
 * table.add(null, prepared); // every row into group 0
 * table.summary(g, 0.04).ne;
 */
export class GroupStatsTable {
  groupCount = 0;
  private capacity = 0;
  private moments: Float64Array = new Float64Array(0);
  private reliability: Float64Array = new Float64Array(0);
  private readonly histograms: Float64Array[] = [];

  constructor(
    readonly reliabilityBins: number,
    readonly aucBins: number,
  ) {}

  /** A new empty group; its id is the previous group count. */
  addGroup(): number {
    if (this.groupCount === this.capacity) {
      this.capacity = Math.max(1, 2 * this.capacity);
      this.moments = grow(this.moments, this.capacity * MOMENTS);
      this.reliability = grow(this.reliability, this.capacity * RELIABILITY * this.reliabilityBins);
    }
    this.histograms.push(new Float64Array(2 * this.aucBins));
    return this.groupCount++;
  }

  /** Adds each row to its group (`groupOf[i]`), or every row to group 0 when groupOf is null. */
  add(groupOf: Int32Array | null, rows: PreparedRows): void {
    const { predicted, label, weight, loss, reliabilityBin, logit } = rows;
    const moments = this.moments;
    const reliability = this.reliability;
    const histograms = this.histograms;
    const relStride = RELIABILITY * this.reliabilityBins;
    const aucBins = this.aucBins;
    for (let i = 0; i < rows.length; i++) {
      const g = groupOf === null ? 0 : groupOf[i];
      const w = weight === undefined ? 1 : weight[i];
      const p = predicted[i];
      const y = label[i];
      const m = g * MOMENTS;
      moments[m] += 1;
      moments[m + 1] += y;
      moments[m + 2] += w;
      moments[m + 3] += w * p;
      moments[m + 4] += w * y;
      moments[m + 5] += w * loss[i];
      moments[m + 6] += w * (p - y) * (p - y);
      const r = g * relStride + RELIABILITY * reliabilityBin[i];
      reliability[r] += 1;
      reliability[r + 1] += w;
      reliability[r + 2] += w * p;
      reliability[r + 3] += w * y;
      histograms[g][2 * scoreHistogramBin(logit[i], aucBins) + y] += w;
    }
  }

  /** The reliability table of a group (fresh arrays). */
  reliabilityOf(group: number): ReliabilityBins {
    const bins = this.reliabilityBins;
    const count = new Float64Array(bins);
    const weight = new Float64Array(bins);
    const sumPredicted = new Float64Array(bins);
    const sumObserved = new Float64Array(bins);
    for (let k = 0, r = group * RELIABILITY * bins; k < bins; k++, r += RELIABILITY) {
      count[k] = this.reliability[r];
      weight[k] = this.reliability[r + 1];
      sumPredicted[k] = this.reliability[r + 2];
      sumObserved[k] = this.reliability[r + 3];
    }
    return reliabilityFromSums(count, weight, sumPredicted, sumObserved);
  }

  /** The headline metrics of a group; NaN where the group has no weight or lacks a class. */
  summary(
    group: number,
    trainingRate: number,
    reliability = this.reliabilityOf(group),
  ): OutcomeSummary {
    const m = group * MOMENTS;
    const mo = this.moments;
    const total = mo[m + 2];
    const logLoss = mo[m + 5] / total;
    const { auc, errorBound } = histogramAuc(this.histograms[group], 0, this.aucBins);
    return {
      rows: mo[m],
      positives: mo[m + 1],
      positiveRate: mo[m + 4] / total,
      logLoss,
      ne: logLoss / binaryEntropy(trainingRate),
      calibration: mo[m + 3] / mo[m + 4],
      auc,
      aucErrorBound: errorBound,
      brier: mo[m + 6] / total,
      ece: calibrationErrorOfBins(reliability),
    };
  }
}

function grow(old: Float64Array, length: number): Float64Array {
  const next = new Float64Array(length);
  next.set(old);
  return next;
}
