import { describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import { binaryEntropy } from "../../trainer/metrics/binary-entropy.js";
import { brierScore } from "../../trainer/metrics/brier-score.js";
import { calibration } from "../../trainer/metrics/calibration.js";
import { logLoss } from "../../trainer/metrics/log-loss.js";
import { normalizedEntropy } from "../../trainer/metrics/normalized-entropy.js";

const f64 = (...v: number[]) => Float64Array.from(v);
const u8 = (...v: number[]) => Uint8Array.from(v);

describe("logLoss", () => {
  it("matches the scikit-learn documentation examples", () => {
    // Source: scikit-learn documentation, sklearn.metrics.log_loss example (check-values.md).
    const p = f64(0.9, 0.1, 0.2, 0.65);
    const y = u8(1, 0, 0, 1);
    expect(logLoss(p, y)).toBeCloseTo(0.21616187468057912, 14);
    // Same documentation, with sample_weight = [1.5, 2, 1, 0.5].
    expect(logLoss(p, y, f64(1.5, 2, 1, 0.5))).toBeCloseTo(0.16145936283256573, 14);
  });

  it("clamps p to [1e-15, 1 - 1e-15] so certainty that is wrong costs -ln(1e-15)", () => {
    expect(logLoss(f64(0), u8(1))).toBeCloseTo(-Math.log(1e-15), 12);
    expect(logLoss(f64(1), u8(0))).toBeCloseTo(-Math.log(1 - (1 - 1e-15)), 6);
    expect(logLoss(f64(1), u8(1))).toBeLessThan(1e-14);
  });

  it("gathers every input problem into one error", () => {
    let error: unknown;
    try {
      logLoss(f64(0.5, NaN, 1.5), u8(1, 2, 0), f64(1, -1, 1));
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(LeafcastError);
    const codes = (error as LeafcastError).issues.map((i) => i.code);
    expect(codes).toEqual(["not_a_probability", "not_a_probability", "not_a_label", "bad_weight"]);
    expect((error as LeafcastError).message).toContain(
      "metrics: logLoss: prediction expected a probability in [0, 1], found NaN (index 1)",
    );
    expect(() => logLoss(f64(0.5), u8(1, 0))).toThrow(/labels expected 1 entries/);
    expect(() => logLoss(f64(), u8())).toThrow(/at least one row/);
    expect(() => logLoss(f64(0.5), u8(1), f64(0))).toThrow(/positive total/);
  });
});

describe("brierScore", () => {
  it("matches the scikit-learn documentation example", () => {
    // Source: scikit-learn documentation, sklearn.metrics.brier_score_loss example (check-values.md).
    expect(brierScore(f64(0.1, 0.9, 0.8, 0.3), u8(0, 1, 1, 0))).toBeCloseTo(0.0375, 15);
  });

  it("weights rows as repeats", () => {
    // Hand computation: weights (2, 1) repeat the first row twice.
    expect(brierScore(f64(0.2, 0.6), u8(1, 0), f64(2, 1))).toBeCloseTo((2 * 0.64 + 0.36) / 3, 15);
  });
});

describe("normalizedEntropy", () => {
  it("is log loss over the entropy of the training rate", () => {
    // Hand computation (definition of He et al. 2014, check-values.md):
    // H(0.25) = -(0.25 ln 0.25 + 0.75 ln 0.75) = 0.5623351446188083.
    const h = -(0.25 * Math.log(0.25) + 0.75 * Math.log(0.75));
    expect(binaryEntropy(0.25)).toBeCloseTo(0.5623351446188083, 15);
    const p = f64(0.9, 0.1, 0.2, 0.65);
    const y = u8(1, 0, 0, 1);
    // log loss from the scikit-learn example above
    expect(normalizedEntropy(p, y, 0.25)).toBeCloseTo(0.21616187468057912 / h, 14);
    expect(normalizedEntropy(p, y, 0.25)).toBeCloseTo(0.3844004, 7);
  });

  it("is 1 for a model that always predicts the training rate on data with that rate", () => {
    // Hand computation: the log loss of the constant 0.25 on a 1-in-4 sample is H(0.25).
    expect(normalizedEntropy(f64(0.25, 0.25, 0.25, 0.25), u8(1, 0, 0, 0), 0.25)).toBeCloseTo(1, 14);
  });

  it("refuses a training rate of 0 or 1, where the entropy is zero", () => {
    expect(() => normalizedEntropy(f64(0.5), u8(1), 0)).toThrow(/strictly between 0 and 1/);
    expect(() => normalizedEntropy(f64(0.5), u8(1), 1)).toThrow(LeafcastError);
  });
});

describe("calibration", () => {
  it("is the mean prediction over the observed positive rate", () => {
    // Hand computation: (0.1 + 0.9 + 0.8 + 0.3) / 4 = 0.525 over 2 / 4 = 0.5.
    expect(calibration(f64(0.1, 0.9, 0.8, 0.3), u8(0, 1, 1, 0))).toBeCloseTo(1.05, 15);
    // Weighted: (2 * 0.2 + 0.6) / 3 over 2 / 3.
    expect(calibration(f64(0.2, 0.6), u8(1, 0), f64(2, 1))).toBeCloseTo(0.5, 15);
    expect(calibration(f64(0.2), u8(0))).toBe(Infinity);
  });
});
