import { describe, expect, it } from "vitest";
import { learnHeads } from "../../trainer/heads/learn-heads.js";
import { progressiveReport } from "../../trainer/heads/progressive-report.js";
import { recalibrate } from "../../trainer/heads/recalibrate.js";
import { encodedRows, headBatch, headSetup } from "./head-fixtures.js";

describe("re-calibration after negative downsampling", () => {
  // Source: He et al., ADKDD 2014, q = p / (p + (1 - p) / w); example computed in
  // /work/shared/check-values.md: a true rate of 0.1 % under w = 0.01 becomes 9.10 %
  // in the sampled data, and q maps it back to 0.1 %.
  it("maps the published example back to the true rate", () => {
    const rate = 0.01;
    const trueRate = 0.001;
    // Keeping every positive and 1 % of negatives: sampled rate = p / (p + (1 - p) w).
    const sampled = trueRate / (trueRate + (1 - trueRate) * rate);
    expect(sampled).toBeCloseTo(0.091, 4);
    expect(recalibrate(sampled, rate)).toBeCloseTo(trueRate, 12);
    expect(recalibrate(0.3, 1)).toBe(0.3);
  });

  it("scores rows with the served (re-calibrated) probability in progressive validation", async () => {
    // A head with nothing learned predicts p = 0.5 on the sampled scale; served,
    // that is recalibrate(0.5, 0.1) = 0.1 / 1.1 (formula above).
    const setup = headSetup(["save"], 1, { negativeKeepRate: { save: 0.1 } });
    const state = await learnHeads([headBatch(encodedRows([[0]]), [[0]])], setup, { workers: 0 });
    const [report] = progressiveReport(state);
    expect(report.overall.meanPredicted).toBeCloseTo(0.1 / 1.1, 12);
    expect(report.overall.logLoss).toBeCloseTo(-Math.log(1 - 0.1 / 1.1), 12);
  });
});
