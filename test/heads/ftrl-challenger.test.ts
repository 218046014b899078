import { describe, expect, it } from "vitest";
import { exportHeadModels } from "../../trainer/heads/export-head-models.js";
import { learnHeads } from "../../trainer/heads/learn-heads.js";
import { encodedRows, headBatch, headSetup } from "./head-fixtures.js";

// Source: Dalal, Fowlkes & Hoadley, JASA 1989, the 23 Challenger launches exactly as
// listed in /work/shared/check-values.md (temperature in deg F : any O-ring damage).
// Unregularized MLE: logit p = 15.0429 - 0.2322 T; residual deviance 20.315 (computed).
const launches =
  "53:1 57:1 58:1 63:1 66:0 67:0 67:0 67:0 68:0 69:0 70:1 70:0 70:1 70:0 72:0 73:0 75:0 75:1 76:0 76:0 78:0 79:0 81:0"
    .split(" ")
    .map((pair) => pair.split(":").map(Number));

describe("FTRL-Proximal on the Challenger O-ring data", () => {
  it("reaches the published maximum-likelihood fit within 1 %", async () => {
    expect(launches).toHaveLength(23);
    // Temperature is centred (a real-valued feature) and the intercept mapped back:
    // b = b_centred - slope * mean. lambda1 = 0 and a tiny lambda2 leave the MLE.
    const mean = launches.reduce((sum, [t]) => sum + t, 0) / launches.length;
    const passes = 10_000;
    const batch = headBatch(
      encodedRows(
        launches.map(() => [0]),
        launches.map(([t]) => [t - mean]),
      ),
      [launches.map(([, damage]) => damage)],
    );
    const setup = headSetup(["damage"], 1, { alpha: 0.1, beta: 1, lambda1: 0, lambda2: 1e-6 });
    const stream = Array.from({ length: passes }, () => batch);
    const state = await learnHeads(stream, setup, { workers: 0 });
    const [head] = exportHeadModels(state);
    const slope = head.weight[0];
    const intercept = head.bias - slope * mean;
    expect(Math.abs(intercept / 15.0429 - 1)).toBeLessThan(0.01);
    expect(Math.abs(slope / -0.2322 - 1)).toBeLessThan(0.01);

    // The fitted curve's residual deviance, -2 log L, should sit at the published minimum (tolerance 0.01).
    let deviance = 0;
    for (const [t, damage] of launches) {
      const p = 1 / (1 + Math.exp(-(intercept + slope * t)));
      deviance -= 2 * Math.log(damage === 1 ? p : 1 - p);
    }
    expect(deviance).toBeCloseTo(20.315, 2);
  });
});
