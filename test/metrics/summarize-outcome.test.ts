import { describe, expect, it } from "vitest";
import { brierScore } from "../../trainer/metrics/brier-score.js";
import { calibration } from "../../trainer/metrics/calibration.js";
import { expectedCalibrationError } from "../../trainer/metrics/expected-calibration-error.js";
import { logLoss } from "../../trainer/metrics/log-loss.js";
import { normalizedEntropy } from "../../trainer/metrics/normalized-entropy.js";
import { rocAuc } from "../../trainer/metrics/roc-auc.js";
import { summarizeOutcome } from "../../trainer/metrics/summarize-outcome.js";

describe("summarizeOutcome", () => {
  it("matches the published examples in one call", () => {
    // Source: scikit-learn documentation examples for brier_score_loss and log_loss (check-values.md).
    const brier = summarizeOutcome(
      Float64Array.of(0.1, 0.9, 0.8, 0.3),
      Uint8Array.of(0, 1, 1, 0),
      0.5,
    );
    expect(brier.brier).toBeCloseTo(0.0375, 15);
    expect(brier.auc).toBe(1);
    const p = Float64Array.of(0.9, 0.1, 0.2, 0.65);
    const y = Uint8Array.of(1, 0, 0, 1);
    const w = Float64Array.of(1.5, 2, 1, 0.5);
    expect(summarizeOutcome(p, y, 0.5).logLoss).toBeCloseTo(0.21616187468057912, 14);
    expect(summarizeOutcome(p, y, 0.5, { weight: w }).logLoss).toBeCloseTo(0.16145936283256573, 14);
  });

  it("agrees with each metric function, weighted", () => {
    const n = 500;
    const p = Float64Array.from({ length: n }, (_, i) => ((i * 37) % 101) / 100);
    const y = Uint8Array.from({ length: n }, (_, i) =>
      (i * 53) % 7 < 2 + (p[i] > 0.5 ? 2 : 0) ? 1 : 0,
    );
    const w = Float64Array.from({ length: n }, (_, i) => 1 + (i % 4));
    const s = summarizeOutcome(p, y, 0.3, { weight: w, eceBins: 15 });
    expect(s.rows).toBe(n);
    expect(s.positives).toBe(y.reduce((a, b) => a + b, 0));
    expect(s.positiveRate).toBeCloseTo(
      y.reduce((a, v, i) => a + v * w[i], 0) / w.reduce((a, b) => a + b, 0),
      14,
    );
    expect(s.logLoss).toBeCloseTo(logLoss(p, y, w), 13);
    expect(s.ne).toBeCloseTo(normalizedEntropy(p, y, 0.3, w), 13);
    expect(s.calibration).toBeCloseTo(calibration(p, y, w), 13);
    expect(s.auc).toBe(rocAuc(p, y, w));
    expect(s.aucErrorBound).toBe(0);
    expect(s.brier).toBeCloseTo(brierScore(p, y, w), 13);
    expect(s.ece).toBeCloseTo(expectedCalibrationError(p, y, 15, w), 13);
  });
});
