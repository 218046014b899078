import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { brierScore } from "../../trainer/metrics/brier-score.js";
import { calibration } from "../../trainer/metrics/calibration.js";
import { expectedCalibrationError } from "../../trainer/metrics/expected-calibration-error.js";
import { histogramAuc } from "../../trainer/metrics/histogram-auc.js";
import { logLoss } from "../../trainer/metrics/log-loss.js";
import { MetricAccumulator, type GroupMetrics } from "../../trainer/metrics/metric-accumulator.js";
import { normalizedEntropy } from "../../trainer/metrics/normalized-entropy.js";
import { reliabilityBins } from "../../trainer/metrics/reliability-bins.js";
import { rocAuc } from "../../trainer/metrics/roc-auc.js";

const DAY_MS = 86_400_000;
const TRAINING_RATE = 0.2;

interface Rows {
  p: Float64Array;
  y: Uint8Array;
  w: Float64Array;
  t: Float64Array;
  segment: Int32Array;
}

/** Invented scored rows: a rare outcome, scores that depend on it, ties from rounding. */
function makeRows(n: number, seed: number): Rows {
  let s = seed >>> 0;
  const next = () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
  const rows: Rows = {
    p: new Float64Array(n),
    y: new Uint8Array(n),
    w: new Float64Array(n),
    t: new Float64Array(n),
    segment: new Int32Array(n),
  };
  const start = Date.UTC(2024, 4, 6, 9);
  for (let i = 0; i < n; i++) {
    const y = next() < 0.15 ? 1 : 0;
    const logit = -2 + 1.5 * y + 1.2 * (next() + next() - 1) * 2;
    const p = 1 / (1 + Math.exp(-logit));
    rows.y[i] = y;
    rows.p[i] = i % 5 === 0 ? Math.round(p * 20) / 20 : p; // every fifth score on a coarse grid: ties
    rows.w[i] = i % 11 === 0 ? 0 : 0.5 + next();
    rows.t[i] = start + (i * (6 * DAY_MS)) / n + (i % 3) * 3_600_000; // six days, slightly out of order
    rows.segment[i] = Math.floor(next() * 5) - 1; // -1 = missing
  }
  return rows;
}

function pick(rows: Rows, keep: (i: number) => boolean) {
  const idx = Array.from(rows.p.keys()).filter(keep);
  return {
    p: Float64Array.from(idx, (i) => rows.p[i]),
    y: Uint8Array.from(idx, (i) => rows.y[i]),
    w: Float64Array.from(idx, (i) => rows.w[i]),
  };
}

/** Streaming figures against the array functions (sums in another order: 1e-10 relative). */
function expectSameAsArrays(
  got: GroupMetrics,
  p: Float64Array,
  y: Uint8Array,
  w: Float64Array,
): void {
  const close = (a: number, b: number) =>
    expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-10 * Math.max(1, Math.abs(b)));
  const s = got.summary;
  expect(s.rows).toBe(p.length);
  expect(s.positives).toBe(y.reduce((a, b) => a + b, 0));
  close(s.logLoss, logLoss(p, y, w));
  close(s.ne, normalizedEntropy(p, y, TRAINING_RATE, w));
  close(s.calibration, calibration(p, y, w));
  close(s.brier, brierScore(p, y, w));
  close(s.ece, expectedCalibrationError(p, y, 10, w));
  const exact = rocAuc(p, y, w);
  expect(Math.abs(s.auc - exact)).toBeLessThanOrEqual(s.aucErrorBound + 1e-12);
  const bins = reliabilityBins(p, y, 10, w);
  expect(Array.from(got.reliability.count)).toEqual(Array.from(bins.count));
  for (let k = 0; k < 10; k++) {
    close(got.reliability.weight[k], bins.weight[k]);
    if (bins.weight[k] > 0) close(got.reliability.meanPredicted[k], bins.meanPredicted[k]);
  }
}

function feed(acc: MetricAccumulator, rows: Rows, cuts: number[]): void {
  const bounds = [
    0,
    ...cuts.filter((c) => c > 0 && c < rows.p.length).sort((a, b) => a - b),
    rows.p.length,
  ];
  for (let b = 0; b + 1 < bounds.length; b++) {
    const [lo, hi] = [bounds[b], bounds[b + 1]];
    acc.add(rows.p.subarray(lo, hi), rows.y.subarray(lo, hi), {
      weight: rows.w.subarray(lo, hi),
      timestampMs: rows.t.subarray(lo, hi),
      segment: rows.segment.subarray(lo, hi),
    });
  }
}

describe("MetricAccumulator", () => {
  const rows = makeRows(6000, 7);
  const acc = new MetricAccumulator({ sliceHours: 24, bySegment: true });
  feed(acc, rows, [1, 777, 778, 2500, 5999]);

  it("gives the array functions' figures overall", () => {
    expectSameAsArrays(acc.overall(TRAINING_RATE), rows.p, rows.y, rows.w);
    // The bound counts every pair sharing a bin, true ties included (a fifth of these
    // scores sit on a 0.05 grid), so it is conservative; on continuous scores alone it is
    // far smaller at the default 2^14 bins.
    const continuous = pick(rows, (i) => i % 5 !== 0);
    const a = new MetricAccumulator();
    a.add(continuous.p, continuous.y, { weight: continuous.w });
    const s = a.overall(TRAINING_RATE).summary;
    expect(s.aucErrorBound).toBeLessThan(2e-4);
    expect(Math.abs(s.auc - rocAuc(continuous.p, continuous.y, continuous.w))).toBeLessThanOrEqual(
      s.aucErrorBound,
    );
  });

  it("gives them per day, in time order", () => {
    const slices = acc.slices(TRAINING_RATE);
    expect(slices.length).toBeGreaterThanOrEqual(6);
    for (let i = 0; i < slices.length; i++) {
      const { startMs, endMs } = slices[i];
      expect(endMs - startMs).toBe(DAY_MS);
      expect(startMs % DAY_MS).toBe(0); // slices start at midnight UTC with the default origin
      if (i > 0) expect(startMs).toBeGreaterThan(slices[i - 1].startMs);
      const subset = pick(rows, (r) => rows.t[r] >= startMs && rows.t[r] < endMs);
      expectSameAsArrays(slices[i], subset.p, subset.y, subset.w);
    }
    expect(slices.reduce((a, s) => a + s.summary.rows, 0)).toBe(rows.p.length);
  });

  it("gives them per segment, the missing code first", () => {
    const segments = acc.segments(TRAINING_RATE);
    expect(segments.map((s) => s.code)).toEqual([-1, 0, 1, 2, 3]);
    for (const segment of segments) {
      const subset = pick(rows, (r) => rows.segment[r] === segment.code);
      expectSameAsArrays(segment, subset.p, subset.y, subset.w);
    }
  });

  it("gives the same figures however the data is cut into batches", () => {
    const small = makeRows(300, 11);
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: 300 }), { maxLength: 8 }), (cuts) => {
        const a = new MetricAccumulator({ sliceHours: 168, bySegment: true });
        feed(a, small, cuts);
        expectSameAsArrays(a.overall(TRAINING_RATE), small.p, small.y, small.w);
        const weeks = a.slices(TRAINING_RATE);
        expect(weeks.reduce((n, s) => n + s.summary.rows, 0)).toBe(300);
      }),
      { numRuns: 40 },
    );
  });

  it("gives the exact AUC, with a zero bound, when no histogram bin holds both classes", () => {
    // Scores on a coarse grid: distinct values land in distinct bins, equal values are true ties.
    const grid = makeRows(2000, 3);
    grid.p = grid.p.map((p) => Math.max(0.05, Math.round(p * 10) / 10));
    const a = new MetricAccumulator({ aucBins: 1 << 12 });
    a.add(grid.p, grid.y, { weight: grid.w });
    const s = a.overall(TRAINING_RATE).summary;
    // Bins are shared only by equal scores, so the bound counts true ties only; the AUC is exact.
    expect(s.auc).toBeCloseTo(rocAuc(grid.p, grid.y, grid.w), 12);
    // A histogram whose bins each hold one class has a zero bound. Hand case: negatives
    // 3 | - | 1 | -, positives - | 2 | - | 1: credit 2 * 3 + 1 * 4 = 10 of 4 * 3 pairs.
    expect(histogramAuc(Float64Array.of(3, 0, 0, 2, 1, 0, 0, 1), 0, 4)).toEqual({
      auc: 10 / 12,
      errorBound: 0,
    });
  });

  it("keeps the error within the stated bound even with coarse bins", () => {
    const coarse = new MetricAccumulator({ aucBins: 64 });
    coarse.add(rows.p, rows.y, { weight: rows.w });
    const s = coarse.overall(TRAINING_RATE).summary;
    const exact = rocAuc(rows.p, rows.y, rows.w);
    expect(s.aucErrorBound).toBeGreaterThan(1e-3);
    expect(Math.abs(s.auc - exact)).toBeLessThanOrEqual(s.aucErrorBound);
  });

  it("starts weekly slices at the given origin", () => {
    const monday = 345_600_000; // 1970-01-05T00:00Z
    const a = new MetricAccumulator({ sliceHours: 168, sliceOriginMs: monday });
    a.add(Float64Array.of(0.2, 0.3), Uint8Array.of(1, 0), {
      timestampMs: Float64Array.of(Date.UTC(2024, 4, 6, 8), Date.UTC(2024, 4, 13, 8)), // two Mondays
    });
    const weeks = a.slices(TRAINING_RATE);
    expect(weeks.map((w) => new Date(w.startMs).toISOString())).toEqual([
      "2024-05-06T00:00:00.000Z",
      "2024-05-13T00:00:00.000Z",
    ]);
  });

  it("says which column is missing or wrong", () => {
    const a = new MetricAccumulator({ sliceHours: 1, bySegment: true });
    expect(() => a.add(Float64Array.of(0.5), Uint8Array.of(1))).toThrow(
      /expected a timestampMs column \(the accumulator groups by it\), found none/,
    );
    expect(() =>
      a.add(Float64Array.of(0.5), Uint8Array.of(1), {
        timestampMs: Float64Array.of(NaN),
        segment: Int32Array.of(-2),
      }),
    ).toThrow(/timestampMs expected epoch milliseconds, found NaN \(index 0\)/);
    expect(() => new MetricAccumulator({ sliceHours: 0 })).toThrow(
      /slice hours expected a positive number/,
    );
    a.add(new Float64Array(0), new Uint8Array(0), {
      timestampMs: new Float64Array(0),
      segment: new Int32Array(0),
    });
    expect(a.overall(TRAINING_RATE).summary.rows).toBe(0);
  });
});
