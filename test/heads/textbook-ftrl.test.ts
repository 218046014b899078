import { describe, expect, it } from "vitest";
import { learnHeads } from "../../trainer/heads/learn-heads.js";
import { negativeKeepDraw } from "../../trainer/heads/negative-keep-draw.js";
import { progressiveReport } from "../../trainer/heads/progressive-report.js";
import { STAT_FIELDS } from "../../trainer/heads/progressive-stats.js";
import { encodedRows, headBatch, headSetup, uniform } from "./head-fixtures.js";

/*
 * An independent, deliberately plain FTRL-Proximal written from the formulas in
 * /work/shared/check-values.md (McMahan et al., KDD 2013, Algorithm 1, branchy
 * textbook form, one head at a time, Maps instead of typed arrays), with
 * progressive validation (score every row before training on it) and the
 * normalized entropy and calibration of He et al., ADKDD 2014. Leafcast's
 * conventions it follows: the bias has no L1/L2, sample weights scale the
 * gradient, kept negatives weigh 1/rate under "weight".
 */
const alpha = 0.08;
const beta = 1;
const lambda1 = 0.3;
const lambda2 = 0.7;

function textbook(
  rows: number[][],
  values: number[][],
  labels: number[],
  weights: number[],
  head: number,
  rate: number,
): { z: Map<number, number>; n: Map<number, number>; loss: number; predicted: number } {
  const z = new Map<number, number>();
  const n = new Map<number, number>();
  const BIAS = -1;
  const weightOf = (i: number): number => {
    const zi = z.get(i) ?? 0;
    const ni = n.get(i) ?? 0;
    const l1 = i === BIAS ? 0 : lambda1;
    const l2 = i === BIAS ? 0 : lambda2;
    if (Math.abs(zi) <= l1) return 0;
    return -(zi - Math.sign(zi) * l1) / ((beta + Math.sqrt(ni)) / alpha + l2);
  };
  let loss = 0;
  let predicted = 0;
  rows.forEach((row, r) => {
    const xs = [...row.map((i, k) => [i, values[r][k]]), [BIAS, 1]];
    const w = xs.map(([i]) => weightOf(i));
    const p = 1 / (1 + Math.exp(-xs.reduce((sum, [, x], k) => sum + w[k] * x, 0)));
    const y = labels[r];
    loss += weights[r] * -Math.log(y === 1 ? p : 1 - p);
    predicted += weights[r] * p;
    const keep = y === 1 || negativeKeepDraw(r, head, 7) < rate * 2 ** 32;
    if (!keep) return;
    const scale = y === 1 ? weights[r] : weights[r] / rate;
    xs.forEach(([i, x], k) => {
      const g = scale * (p - y) * x;
      const ni = n.get(i) ?? 0;
      const sigma = (Math.sqrt(ni + g * g) - Math.sqrt(ni)) / alpha;
      z.set(i, (z.get(i) ?? 0) + g - sigma * w[k]);
      n.set(i, ni + g * g);
    });
  });
  return { z, n, loss, predicted };
}

describe("the training kernel against a textbook FTRL-Proximal", () => {
  it("gives the same z, n and progressive-validation sums", async () => {
    const random = uniform(3);
    const indexSize = 40;
    const rowCount = 3000;
    const rows: number[][] = [];
    const values: number[][] = [];
    const labels: number[][] = [[], [], []];
    const weights: number[] = [];
    const day = 86_400_000;
    const timestamps = new Float64Array(rowCount);
    for (let r = 0; r < rowCount; r++) {
      const row = [...new Set(Array.from({ length: 5 }, () => Math.floor(random() * indexSize)))];
      // Every 7th row repeats an index next to itself, as the encoder writes two
      // features hashed into one bucket; Algorithm 1 applies each entry in turn.
      if (r % 7 === 0) row.push(row[row.length - 1]);
      rows.push(row);
      values.push(row.map(() => Math.round((random() * 2 - 0.5) * 100) / 100));
      for (const column of labels) column.push(random() < 0.2 + 0.1 * (row[0] % 3) ? 1 : 0);
      weights.push(0.5 + random());
      timestamps[r] = day * 19_000 + Math.floor((r / rowCount) * 3 * day);
    }
    const rates = [1, 0.5, 0.2];
    const setup = headSetup(["open", "reply", "hide"], indexSize, {
      alpha,
      beta,
      lambda1,
      lambda2,
      negativeKeepRate: { reply: rates[1], hide: rates[2] },
      downsampleCorrection: "weight",
    });
    const batch = headBatch(
      encodedRows(rows, values),
      labels,
      Float64Array.from(weights),
      timestamps,
    );
    const state = await learnHeads([batch], setup, { workers: 0 });
    const report = progressiveReport(state);

    for (let head = 0; head < 3; head++) {
      const reference = textbook(rows, values, labels[head], weights, head, rates[head]);
      for (let i = -1; i < indexSize; i++) {
        const at = (i === -1 ? indexSize : i) * 3 + head;
        // Tolerance 1e-9 absolute: same formulas, different order of operations.
        expect(state.z[at]).toBeCloseTo(reference.z.get(i) ?? 0, 9);
        expect(state.n[at]).toBeCloseTo(reference.n.get(i) ?? 0, 9);
      }
      const weightSum = weights.reduce((a, b) => a + b, 0);
      const positives = labels[head].reduce((sum, y, r) => sum + y * weights[r], 0);
      const rate = positives / weightSum;
      const entropy = -(rate * Math.log(rate) + (1 - rate) * Math.log(1 - rate));
      const overall = report[head].overall;
      expect(overall.rows).toBe(rowCount);
      expect(overall.logLoss).toBeCloseTo(reference.loss / weightSum, 10);
      expect(overall.normalizedEntropy).toBeCloseTo(reference.loss / weightSum / entropy, 10);
      expect(overall.calibration).toBeCloseTo(reference.predicted / positives, 10);
      // Three days of rows in 24-hour slices; the slices add up to the whole.
      expect(report[head].slices.map((s) => s.start)).toEqual(
        [0, 1, 2].map((d) => (19_000 + d) * day),
      );
      expect(report[head].slices.reduce((sum, s) => sum + s.rows, 0)).toBe(rowCount);
      // The last slice's NE divides by H(p) with p the positive rate of all rows so far.
      const last = report[head].slices[2];
      expect(last.normalizedEntropy).toBeCloseTo(last.logLoss / entropy, 12);
      const lossSum = state.progressive.sliceIndexes.reduce(
        (sum, _, slot) => sum + state.progressive.sliceStats[(slot * 3 + head) * STAT_FIELDS],
        0,
      );
      expect(lossSum).toBeCloseTo(reference.loss, 8);
    }
  });
});
