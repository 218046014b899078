import { describe, expect, it } from "vitest";
import { ftrlWeight } from "../../trainer/heads/ftrl-weight.js";
import { exportHeadModels } from "../../trainer/heads/export-head-models.js";
import { learnHeads } from "../../trainer/heads/learn-heads.js";
import { encodedRows, headBatch, headSetup } from "./head-fixtures.js";

// Source: /work/shared/check-values.md, FTRL-Proximal one-step check (computed from
// McMahan et al., KDD 2013, Algorithm 1): alpha = 0.1, beta = 1, lambda1 = lambda2 = 0,
// x = 1, y = 1, from z = n = 0 -> z = -0.5, n = 0.25, next w = 0.0333333.
describe("FTRL-Proximal one step", () => {
  it("matches the published one-step values", async () => {
    const setup = headSetup(["open"], 1, { alpha: 0.1, beta: 1, lambda1: 0, lambda2: 0 });
    const state = await learnHeads([headBatch(encodedRows([[0]]), [[1]])], setup, { workers: 0 });
    const coordinate = 0;
    expect(state.z[coordinate]).toBeCloseTo(-0.5, 12);
    expect(state.n[coordinate]).toBeCloseTo(0.25, 12);
    const w = ftrlWeight(state.z[coordinate], Math.sqrt(state.n[coordinate]), 1 / 0.1, 1, 0, 0);
    expect(w).toBeCloseTo(0.0333333, 7);
    const [head] = exportHeadModels(state);
    expect(Array.from(head.index)).toEqual([0]);
    expect(head.weight[0]).toBeCloseTo(0.0333333, 7);
  });

  it("gives the same value with a real-valued x = 1", async () => {
    const setup = headSetup(["open"], 1, { alpha: 0.1, beta: 1 });
    const state = await learnHeads([headBatch(encodedRows([[0]], [[1]]), [[1]])], setup, {
      workers: 0,
    });
    expect(state.z[0]).toBe(-0.5);
    expect(state.n[0]).toBe(0.25);
  });

  it("scales the gradient by the sample weight", async () => {
    // Weighted log loss: the gradient of w * loss is w * (p - y) x (common practice).
    const setup = headSetup(["open"], 1, { alpha: 0.1, beta: 1 });
    const weights = Float64Array.of(2);
    const state = await learnHeads([headBatch(encodedRows([[0]]), [[1]], weights)], setup, {
      workers: 0,
    });
    expect(state.z[0]).toBeCloseTo(-1, 12);
    expect(state.n[0]).toBeCloseTo(1, 12);
  });
});
