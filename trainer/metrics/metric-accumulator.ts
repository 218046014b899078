import { LeafcastError, type Issue } from "../errors.js";
import { checkBinCount } from "./check-bin-count.js";
import { checkMetricInputs } from "./check-metric-inputs.js";
import { checkTrainingRate } from "./check-training-rate.js";
import { checkMetricColumns } from "./check-metric-columns.js";
import { GroupStatsTable } from "./group-stats-table.js";
import type { OutcomeSummary } from "./outcome-summary.js";
import type { ReliabilityBins } from "./reliability-bins.js";
import { prepareRows } from "./prepare-rows.js";

const HOUR_MS = 3_600_000;

/** How a MetricAccumulator groups rows. */
export interface MetricAccumulatorOptions {
  /** Time-slice width in hours (1 hour, 24 day, 168 week); omit for no slices. */
  readonly sliceHours?: number;
  /**
   * Epoch milliseconds where slice 0 starts; default 0 (1970-01-01T00:00Z, so weekly
   * slices start on Thursdays; 345_600_000 makes them start on Mondays).
   */
  readonly sliceOriginMs?: number;
  /** Keep a group per code of a categorical column, passed to add as `segment`. */
  readonly bySegment?: boolean;
  /** Equal-width reliability bins, also used for the ECE; default 10. */
  readonly reliabilityBins?: number;
  /**
   * Score-histogram bins for the overall AUC; default 2^16 (1 MiB). The reported error
   * bound (see histogramAuc) was about 1e-4 at 2^14 bins on a million continuous scores.
   */
  readonly aucBins?: number;
  /**
   * Score-histogram bins for each slice and segment; default 2^12 (64 KiB a group), so a
   * month of hourly slices stays near 50 MiB per outcome.
   */
  readonly groupAucBins?: number;
}

/** Optional per-row columns of a batch. */
export interface MetricColumns {
  readonly weight?: Float64Array;
  /** Milliseconds since the Unix epoch; required when slicing. */
  readonly timestampMs?: Float64Array;
  /** Category codes (-1 = missing); required when segmenting. */
  readonly segment?: Int32Array;
}

/** The metrics of one group of rows. */
export interface GroupMetrics {
  readonly summary: OutcomeSummary;
  readonly reliability: ReliabilityBins;
}

/** A time slice [startMs, endMs). */
export interface SliceMetrics extends GroupMetrics {
  readonly startMs: number;
  readonly endMs: number;
}

/** A segment: the rows whose category code is `code` (-1 = missing). */
export interface SegmentMetrics extends GroupMetrics {
  readonly code: number;
}

/**
 * Streaming metrics of one outcome head, overall, per time slice and per segment, for
 * data larger than memory: add batches, read summaries at any point. Every figure is a
 * sum over rows except AUC, which comes from a fixed histogram of scores on a logit
 * scale, with the bound on its error reported beside it (OutcomeSummary.aucErrorBound).
 *
 * @example
 * const acc = new MetricAccumulator({ sliceHours: 24, bySegment: true });
 * acc.add(predicted, label, { timestampMs, segment: postTypeCodes });
 * acc.overall(0.04).summary.ne;
 * acc.slices(0.04).map((s) => s.summary.calibration);
 */
export class MetricAccumulator {
  private readonly sliceMs: number;
  private readonly sliceOriginMs: number;
  private readonly bySegment: boolean;
  private readonly all: GroupStatsTable;
  private readonly bySlice: GroupStatsTable;
  private readonly bySegmentCode: GroupStatsTable;
  private readonly sliceGroup = new Map<number, number>();
  private readonly sliceKeys: number[] = [];
  /** Group of segment code c at c + 1 (so -1, missing, has a slot); -1 = no group yet. */
  private segmentGroup: Int32Array = new Int32Array(0);
  private readonly segmentCodes: number[] = [];

  constructor(options: MetricAccumulatorOptions = {}) {
    const { sliceHours, sliceOriginMs = 0, bySegment = false } = options;
    const { reliabilityBins = 10, aucBins = 1 << 16, groupAucBins = 1 << 12 } = options;
    checkBinCount("MetricAccumulator reliabilityBins", reliabilityBins);
    checkBinCount("MetricAccumulator aucBins", aucBins);
    checkBinCount("MetricAccumulator groupAucBins", groupAucBins);
    const issues: Issue[] = [];
    if (sliceHours !== undefined && !(sliceHours > 0 && sliceHours < Infinity)) {
      issues.push({
        code: "slice_hours",
        message: `MetricAccumulator: slice hours expected a positive number, found ${sliceHours}`,
      });
    }
    if (!Number.isFinite(sliceOriginMs)) {
      issues.push({
        code: "slice_origin",
        message: `MetricAccumulator: slice origin expected epoch milliseconds, found ${sliceOriginMs}`,
      });
    }
    if (issues.length > 0) throw new LeafcastError("metrics", issues);
    this.sliceMs = sliceHours === undefined ? 0 : sliceHours * HOUR_MS;
    this.sliceOriginMs = sliceOriginMs;
    this.bySegment = bySegment;
    this.all = new GroupStatsTable(reliabilityBins, aucBins);
    this.all.addGroup();
    this.bySlice = new GroupStatsTable(reliabilityBins, groupAucBins);
    this.bySegmentCode = new GroupStatsTable(reliabilityBins, groupAucBins);
  }

  /** Adds a batch of rows (predictions in [0, 1], labels 0/1). */
  add(predicted: Float64Array, label: Uint8Array, columns: MetricColumns = {}): void {
    const { weight, timestampMs, segment } = columns;
    checkMetricInputs("MetricAccumulator.add", predicted, label, weight, false);
    const n = predicted.length;
    checkMetricColumns(n, columns, this.sliceMs > 0, this.bySegment);
    if (n === 0) return;

    const rows = prepareRows(predicted, label, weight, this.all.reliabilityBins);
    this.all.add(null, rows);
    if (this.sliceMs > 0 && timestampMs !== undefined)
      this.bySlice.add(this.sliceGroups(timestampMs), rows);
    if (this.bySegment && segment !== undefined)
      this.bySegmentCode.add(this.segmentGroups(segment), rows);
  }

  /** Metrics over every row added. */
  overall(trainingRate: number): GroupMetrics {
    checkTrainingRate("MetricAccumulator.overall", trainingRate);
    return metricsOf(this.all, 0, trainingRate);
  }

  /** Metrics per time slice that has rows, in time order. */
  slices(trainingRate: number): SliceMetrics[] {
    checkTrainingRate("MetricAccumulator.slices", trainingRate);
    const order = this.sliceKeys
      .map((key, group) => ({ key, group }))
      .sort((a, b) => a.key - b.key);
    return order.map(({ key, group }) => ({
      startMs: this.sliceOriginMs + key * this.sliceMs,
      endMs: this.sliceOriginMs + (key + 1) * this.sliceMs,
      ...metricsOf(this.bySlice, group, trainingRate),
    }));
  }

  /** Metrics per segment code that has rows, in code order (-1, missing, first). */
  segments(trainingRate: number): SegmentMetrics[] {
    checkTrainingRate("MetricAccumulator.segments", trainingRate);
    const order = this.segmentCodes
      .map((code, group) => ({ code, group }))
      .sort((a, b) => a.code - b.code);
    return order.map(({ code, group }) => ({
      code,
      ...metricsOf(this.bySegmentCode, group, trainingRate),
    }));
  }

  private sliceGroups(timestampMs: Float64Array): Int32Array {
    const groups = new Int32Array(timestampMs.length);
    // Logs arrive mostly in time order: remember the last slice to skip the map lookup.
    let lastKey = NaN;
    let lastGroup = -1;
    for (let i = 0; i < timestampMs.length; i++) {
      const key = Math.floor((timestampMs[i] - this.sliceOriginMs) / this.sliceMs);
      if (key !== lastKey) {
        let group = this.sliceGroup.get(key);
        if (group === undefined) {
          group = this.bySlice.addGroup();
          this.sliceGroup.set(key, group);
          this.sliceKeys.push(key);
        }
        lastKey = key;
        lastGroup = group;
      }
      groups[i] = lastGroup;
    }
    return groups;
  }

  private segmentGroups(segment: Int32Array): Int32Array {
    const groups = new Int32Array(segment.length);
    for (let i = 0; i < segment.length; i++) {
      const slot = segment[i] + 1;
      if (slot >= this.segmentGroup.length) {
        const grown = new Int32Array(Math.max(2 * this.segmentGroup.length, slot + 1)).fill(-1);
        grown.set(this.segmentGroup);
        this.segmentGroup = grown;
      }
      let group = this.segmentGroup[slot];
      if (group < 0) {
        group = this.bySegmentCode.addGroup();
        this.segmentGroup[slot] = group;
        this.segmentCodes.push(slot - 1);
      }
      groups[i] = group;
    }
    return groups;
  }
}

function metricsOf(table: GroupStatsTable, group: number, trainingRate: number): GroupMetrics {
  const reliability = table.reliabilityOf(group);
  return { summary: table.summary(group, trainingRate, reliability), reliability };
}
