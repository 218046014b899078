import { describe, expect, it } from "vitest";
import { binFeatures } from "../../trainer/trees/bin-features.js";
import { fitForests } from "../../trainer/trees/fit-forests.js";
import { plainSettings, scoreRaw, sigmoid, testRandom } from "./tree-test-helpers.js";

const binning = { bins: 255, binSampleRows: 10_000, maxCategories: 32, seed: 1 };

// Sensible outcomes for awkward data; each expectation is stated in the test name.
// The reasoning is the usual one for second-order boosting (common practice).
describe("edge cases of tree fitting", () => {
  it("missing values: a split learns to send the missing rows their own way", async () => {
    const random = testRandom(1);
    const rows = 600;
    const x = Float64Array.from({ length: rows }, (_, r) => (r % 3 === 0 ? NaN : random()));
    const label = Uint8Array.from(x, (v) => (Number.isNaN(v) ? 1 : 0));
    const binned = binFeatures(
      { rowCount: rows, numeric: [{ name: "x", values: x }], categorical: [] },
      binning,
    );
    const [fitted] = await fitForests(binned, [{ outcome: "y", label }], {
      settings: plainSettings,
      seed: 1,
      workers: 1,
    });
    const tree = fitted.forest.trees[0];
    expect(tree.feature[0]).toBe(0);
    expect(tree.missingRight[0]).toBe(1); // missing rows right, every present value left
    expect(tree.threshold[0]).toBe(Number.MAX_VALUE);
    // One Newton step from p0 = 1/3 with l2 = 0: leaf values 1 / p0 and -1 / (1 - p0).
    const scores = Array.from(x, (_, r) =>
      scoreRaw(fitted.forest, { numeric: [x], categorical: [] }, r),
    );
    const base = fitted.forest.baseLogit;
    for (let r = 0; r < rows; r++) {
      expect(scores[r]).toBeCloseTo(base + (label[r] === 1 ? 3 : -1.5), 9);
    }
  });

  it("missing values never seen by a split follow the side with more hessian", async () => {
    const random = testRandom(2);
    const rows = 500;
    const x = Float64Array.from({ length: rows }, () => random());
    const label = Uint8Array.from(x, (v) => (v > 0.8 ? 1 : 0));
    const binned = binFeatures(
      { rowCount: rows, numeric: [{ name: "x", values: x }], categorical: [] },
      binning,
    );
    const [fitted] = await fitForests(binned, [{ outcome: "y", label }], {
      settings: plainSettings,
      seed: 1,
      workers: 1,
    });
    const tree = fitted.forest.trees[0];
    // About 80 % of the (equal-hessian) rows are left of the split near 0.8.
    expect(Math.abs(tree.threshold[0] - 0.8)).toBeLessThan(0.01);
    expect(tree.missingRight[0]).toBe(0);
  });

  it("constant features: never split on; alone, every score stays the starting log-odds", async () => {
    const rows = 400;
    const random = testRandom(3);
    const label = Uint8Array.from({ length: rows }, () => (random() < 0.3 ? 1 : 0));
    const binned = binFeatures(
      {
        rowCount: rows,
        numeric: [
          { name: "a", values: new Float64Array(rows).fill(3) },
          { name: "b", values: new Float64Array(rows).fill(-1) },
        ],
        categorical: [{ name: "c", codes: new Int32Array(rows).fill(0), dictionary: ["only"] }],
      },
      binning,
    );
    const [fitted] = await fitForests(binned, [{ outcome: "y", label }], {
      settings: { ...plainSettings, count: 3, depth: 3, leaves: 8, l2: 1, learningRate: 0.5 },
      seed: 1,
      workers: 1,
      returnScores: true,
    });
    for (const tree of fitted.forest.trees)
      expect(Array.from(tree.feature).every((f) => f === -1)).toBe(true);
    expect(fitted.importance.every((i) => i.splits === 0)).toBe(true);
    // The root's gradient sum at the base rate is zero up to rounding (tolerance 1e-9).
    for (const score of fitted.scores as Float64Array) {
      expect(Math.abs(score - fitted.forest.baseLogit)).toBeLessThan(1e-9);
    }
  });

  it("a constant feature beside an informative one is never used", async () => {
    const rows = 400;
    const random = testRandom(4);
    const x = Float64Array.from({ length: rows }, () => random());
    const label = Uint8Array.from(x, (v) => (random() < v ? 1 : 0));
    const binned = binFeatures(
      {
        rowCount: rows,
        numeric: [
          { name: "constant", values: new Float64Array(rows).fill(7) },
          { name: "x", values: x },
        ],
        categorical: [],
      },
      binning,
    );
    const [fitted] = await fitForests(binned, [{ outcome: "y", label }], {
      settings: { ...plainSettings, count: 5, depth: 3, leaves: 8, l2: 1, learningRate: 0.3 },
      seed: 1,
      workers: 1,
    });
    expect(fitted.importance[0]).toEqual({ feature: "constant", gain: 0, cover: 0, splits: 0 });
    expect(fitted.importance[1].splits).toBeGreaterThan(0);
  });

  it.each([0, 1])(
    "a single-class label (all %i) starts from a clamped log-odds and never splits",
    async (y) => {
      const rows = 1000;
      const random = testRandom(5);
      const x = Float64Array.from({ length: rows }, () => random());
      const label = new Uint8Array(rows).fill(y);
      const binned = binFeatures(
        { rowCount: rows, numeric: [{ name: "x", values: x }], categorical: [] },
        binning,
      );
      const [fitted] = await fitForests(binned, [{ outcome: "y", label }], {
        settings: {
          ...plainSettings,
          count: 5,
          depth: 3,
          leaves: 8,
          l2: 1,
          learningRate: 0.1,
          minLeafHessian: 1e-3,
          validationFraction: 0.2,
          patience: 2,
        },
        seed: 1,
        workers: 1,
        returnScores: true,
      });
      // Clamped rate 1e-6 (see base-logit.ts): log(1e-6 / (1 - 1e-6)) = -13.8155...
      expect(fitted.forest.baseLogit).toBeCloseTo(
        (y === 1 ? 1 : -1) * Math.log((1 - 1e-6) / 1e-6),
        9,
      );
      for (const tree of fitted.forest.trees)
        expect(Array.from(tree.feature).every((f) => f === -1)).toBe(true);
      for (const score of fitted.scores as Float64Array) {
        const p = sigmoid(score);
        expect(y === 1 ? p > 1 - 2e-6 : p < 2e-6).toBe(true);
      }
      expect(Number.isFinite(fitted.startTrainLoss) && fitted.startTrainLoss < 1e-5).toBe(true);
      expect(Array.from(fitted.trainLoss).every((l) => Number.isFinite(l) && l < 1e-5)).toBe(true);
    },
  );

  it("a feature with every value missing is never split on, and the others still are", async () => {
    const rows = 500;
    const random = testRandom(6);
    const x = Float64Array.from({ length: rows }, () => random());
    const label = Uint8Array.from(x, (v) => (random() < v ? 1 : 0));
    const binned = binFeatures(
      {
        rowCount: rows,
        numeric: [
          { name: "empty", values: new Float64Array(rows).fill(NaN) },
          { name: "x", values: x },
        ],
        categorical: [
          { name: "unseen", codes: new Int32Array(rows).fill(-1), dictionary: ["a", "b"] },
        ],
      },
      binning,
    );
    expect(binned.valueBins[0]).toBe(1); // one empty value bin, then the missing bin
    expect(binned.contract.categorical[0].values).toEqual([]); // no value seen: left out
    const [fitted] = await fitForests(binned, [{ outcome: "y", label }], {
      settings: { ...plainSettings, count: 4, depth: 2, leaves: 4, l2: 1, learningRate: 0.3 },
      seed: 1,
      workers: 1,
    });
    expect(fitted.importance.map((i) => i.splits)).toEqual([0, expect.any(Number), 0]);
    expect(fitted.importance[1].splits).toBeGreaterThan(0);
    expect(fitted.trainLoss[3]).toBeLessThan(fitted.startTrainLoss);
  });

  it("a low-cardinality category splits natively into its two groups of effects", async () => {
    const rows = 2000;
    const random = testRandom(7);
    const codes = Int32Array.from({ length: rows }, () => Math.floor(random() * 4));
    // Categories 0 and 2 raise the rate, 1 and 3 lower it: no threshold on codes separates them.
    const label = Uint8Array.from(codes, (c) => (random() < (c % 2 === 0 ? 0.8 : 0.2) ? 1 : 0));
    const binned = binFeatures(
      {
        rowCount: rows,
        numeric: [],
        categorical: [{ name: "crop", codes, dictionary: ["leek", "kale", "bean", "onion"] }],
      },
      binning,
    );
    const [fitted] = await fitForests(binned, [{ outcome: "y", label }], {
      settings: plainSettings,
      seed: 1,
      workers: 1,
    });
    const tree = fitted.forest.trees[0];
    expect(tree.feature[0]).toBe(0);
    expect([
      [1, 3],
      [0, 2],
    ]).toContainEqual(Array.from(tree.rightCategories[0] ?? []));
  });
});
