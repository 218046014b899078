import { describe, expect, it } from "vitest";
import { binFeatures } from "../../trainer/trees/bin-features.js";
import { fitForests, type FittedForest } from "../../trainer/trees/fit-forests.js";
import { bits, expectSameForest } from "./same-forest.js";
import { mixedData, plainSettings } from "./tree-test-helpers.js";

// Determinism across thread counts (the done-when list): block histograms
// are summed from zero and merged in block order, so 1 worker and 2 or 3 workers
// must give the same trees bit for bit. Small blocks (1,000 rows) make every node of the
// 24,000 rows span several blocks, as 2.5 M rows would with the default block size.
describe("same seed, same trees with 1 and 2 workers", () => {
  const data = mixedData(11, 24_000);
  const binned = binFeatures(
    { rowCount: data.rows, numeric: data.numeric, categorical: data.categorical },
    { bins: 64, binSampleRows: 5000, maxCategories: 32, seed: 1 },
  );
  const fit = (workers: number, rowFraction: number): Promise<FittedForest[]> =>
    fitForests(
      binned,
      [
        { outcome: "y", label: data.label },
        { outcome: "not_y", label: data.label.map((y) => 1 - y) },
      ],
      {
        settings: {
          ...plainSettings,
          count: 8,
          depth: 5,
          leaves: 24,
          learningRate: 0.2,
          l2: 1,
          rowFraction,
          featureFraction: 0.8,
          validationFraction: 0.1,
          patience: 5,
        },
        seed: 9,
        workers,
        blockRows: 1000,
        returnScores: true,
      },
    );

  // Trees on every training row take their gradients packed by the gradient round;
  // trees on a row sample reorder them per tree: both paths must be deterministic.
  it.each([
    { rowFraction: 1, workers: 2 },
    { rowFraction: 0.9, workers: 3 },
  ])(
    "gives bitwise equal forests, losses and scores ($rowFraction of the rows, 1 vs $workers workers)",
    async ({ rowFraction, workers }) => {
      const one = await fit(1, rowFraction);
      const other = await fit(workers, rowFraction);
      expect(other.length).toBe(one.length);
      one.forEach((a, f) => {
        const b = other[f];
        expectSameForest(a.forest, b.forest);
        expect(bits(b.trainLoss)).toEqual(bits(a.trainLoss));
        expect(bits(b.validationLoss as Float64Array)).toEqual(
          bits(a.validationLoss as Float64Array),
        );
        expect(bits(b.scores as Float64Array)).toEqual(bits(a.scores as Float64Array));
      });
      expect(one[0].forest.trees[0].feature[0]).toBeGreaterThanOrEqual(0); // it did split
    },
  );
});
