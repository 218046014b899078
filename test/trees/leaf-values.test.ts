import { describe, expect, it } from "vitest";
import { binFeatures } from "../../trainer/trees/bin-features.js";
import { fitForests } from "../../trainer/trees/fit-forests.js";
import { plainSettings } from "./tree-test-helpers.js";

// Newton boosting's leaf value -G / (H + lambda) (second-order step with L2 on the
// leaf, common practice), recomputed here by hand from the log-loss gradient p - y
// and hessian p (1 - p) at the starting rate, then shrunk by the learning rate.
describe("leaf values on a hand-made example", () => {
  const x = Float64Array.of(1, 1, 1, 1, 2, 2, 2, 2);
  const label = Uint8Array.of(1, 1, 1, 0, 0, 0, 0, 1);
  const binned = binFeatures(
    { rowCount: 8, numeric: [{ name: "x", values: x }], categorical: [] },
    { bins: 255, binSampleRows: 100, maxCategories: 32, seed: 1 },
  );

  it.each([
    { lambda: 1, rate: 0.3, weight: null },
    { lambda: 0.5, rate: 1, weight: Float64Array.of(1, 2, 1, 1, 3, 1, 1, 2) },
  ])(
    "equal -G / (H + lambda) times the learning rate ($lambda, $rate)",
    async ({ lambda, rate, weight }) => {
      const w = (r: number): number => (weight === null ? 1 : weight[r]);
      let positive = 0;
      let total = 0;
      for (let r = 0; r < 8; r++) {
        positive += w(r) * label[r];
        total += w(r);
      }
      const p0 = positive / total;
      const leaf = (rows: number[]): number => {
        const G = rows.reduce((sum, r) => sum + w(r) * (p0 - label[r]), 0);
        const H = rows.reduce((sum, r) => sum + w(r) * p0 * (1 - p0), 0);
        return (-G / (H + lambda)) * rate;
      };
      const [fitted] = await fitForests(binned, [{ outcome: "y", label }], {
        settings: { ...plainSettings, l2: lambda, learningRate: rate },
        seed: 1,
        workers: 1,
        weight,
      });
      const tree = fitted.forest.trees[0];
      expect(fitted.forest.baseLogit).toBeCloseTo(Math.log(p0 / (1 - p0)), 12);
      expect(tree.feature[0]).toBe(0);
      expect(tree.threshold[0]).toBe(1.5); // halfway between the two values
      // Tolerance 1e-12: the learner sums the same numbers in another order.
      expect(Math.abs(tree.leafValue[0] - leaf([0, 1, 2, 3]))).toBeLessThan(1e-12);
      expect(Math.abs(tree.leafValue[1] - leaf([4, 5, 6, 7]))).toBeLessThan(1e-12);
    },
  );
});
