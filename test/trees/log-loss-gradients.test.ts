import { describe, expect, it } from "vitest";
import { logLossGradients } from "../../trainer/trees/log-loss-gradients.js";
import { testRandom } from "./tree-test-helpers.js";

describe("logLossGradients", () => {
  // Log loss values from the scikit-learn documentation (/work/shared/check-values.md,
  // "Other metrics"): y = [1, 0, 0, 1], p = [0.9, 0.1, 0.2, 0.65] gives
  // 0.21616187468057912; with weights [1.5, 2, 1, 0.5], 0.16145936283256573.
  it("reproduces the published log loss from scores logit(p)", () => {
    const p = [0.9, 0.1, 0.2, 0.65];
    const score = Float64Array.from(p, (q) => Math.log(q / (1 - q)));
    const label = Uint8Array.of(1, 0, 0, 1);
    const gradHess = new Float64Array(8);
    const sums = new Float64Array(4);
    logLossGradients(score, label, null, null, gradHess, -1, 0, 4, sums, 0);
    expect(Math.abs(sums[0] / sums[1] - 0.21616187468057912)).toBeLessThan(1e-14);
    sums.fill(0);
    logLossGradients(
      score,
      label,
      Float64Array.of(1.5, 2, 1, 0.5),
      null,
      gradHess,
      -1,
      0,
      4,
      sums,
      0,
    );
    expect(Math.abs(sums[0] / sums[1] - 0.16145936283256573)).toBeLessThan(1e-14);
  });

  // The inline exp and log1p (logistic-tables.ts) against Math.exp and Math.log1p,
  // relative tolerance 1e-14, over ordinary and extreme scores.
  it("matches gradient, hessian and loss computed with Math.exp and Math.log1p", () => {
    const random = testRandom(1);
    const n = 5000;
    const score = Float64Array.from({ length: n }, (_, i) =>
      i < 10
        ? [0, -0, 1e-300, -1e-12, 36, -36, 700, -745.5, 800, -1e6][i]
        : (random() - 0.5) * (i % 2 ? 20 : 1500),
    );
    const label = Uint8Array.from({ length: n }, () => (random() < 0.5 ? 1 : 0));
    const gradHess = new Float64Array(2 * n);
    const sums = new Float64Array(4);
    const close = (a: number, b: number): boolean =>
      Math.abs(a - b) <= 1e-14 * Math.max(Math.abs(b), 1e-300);
    logLossGradients(score, label, null, null, gradHess, -1, 0, n, sums, 0);
    let loss = 0;
    for (let r = 0; r < n; r++) {
      const s = score[r];
      const y = label[r];
      const e = Math.exp(-Math.abs(s));
      const p = s >= 0 ? 1 / (1 + e) : e / (1 + e);
      const rowLoss = Math.max(s, 0) - y * s + Math.log1p(e);
      loss += rowLoss;
      expect(close(gradHess[2 * r], p - y)).toBe(true);
      expect(close(gradHess[2 * r + 1], e / (1 + e) / (1 + e))).toBe(true);
    }
    expect(close(sums[0], loss) || Math.abs(sums[0] - loss) < 1e-12 * loss).toBe(true);
    expect(sums[1]).toBe(n);
  });

  // Confident, correct rows: loss log1p(exp(-|s|)) is far below one ulp of 1, so
  // it must not come out of a rounded 1 + e. Relative tolerance 1e-14 against
  // Math.log1p(Math.exp(-s)).
  it("keeps the digits of losses near zero", () => {
    const score = Float64Array.of(20, 40, 300, -25);
    const label = Uint8Array.of(1, 1, 1, 0);
    const sums = new Float64Array(4);
    logLossGradients(score, label, null, null, new Float64Array(8), -1, 0, 4, sums, 0);
    const expected = Array.from(score).reduce(
      (sum, s) => sum + Math.log1p(Math.exp(-Math.abs(s))),
      0,
    );
    expect(expected).toBeGreaterThan(0);
    expect(Math.abs(sums[0] - expected)).toBeLessThan(1e-14 * expected);
  });

  it("packs the training rows' pairs from a position, skipping validation rows", () => {
    const out = new Float64Array(8).fill(9);
    const sums = new Float64Array(4);
    const score = Float64Array.of(0, 0, 0);
    logLossGradients(
      score,
      Uint8Array.of(1, 0, 0),
      null,
      Uint8Array.of(0, 1, 0),
      out,
      1,
      0,
      3,
      sums,
      0,
    );
    expect(Array.from(out)).toEqual([9, 9, -0.5, 0.25, 0.5, 0.25, 9, 9]);
  });

  it("gives validation rows zero gradient and counts their loss apart", () => {
    const gradHess = new Float64Array(4).fill(9);
    const sums = new Float64Array(4);
    logLossGradients(
      Float64Array.of(0, 0),
      Uint8Array.of(1, 0),
      null,
      Uint8Array.of(0, 1),
      gradHess,
      -1,
      0,
      2,
      sums,
      0,
    );
    expect(Array.from(gradHess)).toEqual([-0.5, 0.25, 0, 0]);
    expect(sums[0]).toBeCloseTo(Math.LN2, 15);
    expect(sums[2]).toBeCloseTo(Math.LN2, 15);
    expect([sums[1], sums[3]]).toEqual([1, 1]);
  });
});
