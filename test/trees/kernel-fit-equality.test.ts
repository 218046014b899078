import { describe, expect, it } from "vitest";
import { binFeatures } from "../../trainer/trees/bin-features.js";
import { fitForests, type FittedForest } from "../../trainer/trees/fit-forests.js";
import { bits, expectSameForest } from "./same-forest.js";
import { mixedData, plainSettings } from "./tree-test-helpers.js";

// The WebAssembly kernels (trainer/trees/simd) replace JavaScript kernels that stay
// as the reference: whole fits with either must give the same forests, losses and
// scores bit for bit (WebAssembly's f64 and f64x2 arithmetic rounds as IEEE 754
// doubles, as JavaScript's does: common practice). Small blocks make nodes span
// several blocks, and odd block sizes leave lone rows for the paired loops.
describe("WebAssembly and JavaScript kernels fit the same trees", () => {
  const data = mixedData(23, 20_000);
  const binned = binFeatures(
    { rowCount: data.rows, numeric: data.numeric, categorical: data.categorical },
    { bins: 64, binSampleRows: 5000, maxCategories: 32, seed: 1 },
  );
  const weight = Float64Array.from({ length: data.rows }, (_, r) => 0.5 + (r % 5) / 4);
  const fit = (
    javascriptKernels: boolean,
    workers: number,
    rowFraction: number,
    weighted: boolean,
  ): Promise<FittedForest[]> =>
    fitForests(binned, [{ outcome: "y", label: data.label }], {
      settings: {
        ...plainSettings,
        count: 6,
        depth: 5,
        leaves: 24,
        learningRate: 0.3,
        l2: 1,
        rowFraction,
        featureFraction: 0.8,
        validationFraction: 0.1,
        patience: 0,
      },
      seed: 5,
      workers,
      weight: weighted ? weight : null,
      blockRows: 1001,
      returnScores: true,
      javascriptKernels,
    });

  it.each([
    { rowFraction: 1, weighted: false },
    { rowFraction: 0.85, weighted: false },
    { rowFraction: 1, weighted: true },
  ])(
    "bit for bit ($rowFraction of the rows, weighted $weighted)",
    async ({ rowFraction, weighted }) => {
      const reference = await fit(true, 1, rowFraction, weighted);
      const kernel = await fit(false, 2, rowFraction, weighted);
      const a = reference[0];
      const b = kernel[0];
      expectSameForest(a.forest, b.forest);
      expect(bits(b.trainLoss)).toEqual(bits(a.trainLoss));
      expect(bits(b.validationLoss as Float64Array)).toEqual(
        bits(a.validationLoss as Float64Array),
      );
      expect(bits(b.scores as Float64Array)).toEqual(bits(a.scores as Float64Array));
      expect(a.forest.trees[5].feature[0]).toBeGreaterThanOrEqual(0); // it did split
    },
  );
});
