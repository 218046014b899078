import { describe, expect, it } from "vitest";
import { binFeatures } from "../../trainer/trees/bin-features.js";
import { fitForests } from "../../trainer/trees/fit-forests.js";
import {
  mixedData,
  plainSettings,
  scoreRaw,
  testRandom,
  type RawColumns,
} from "./tree-test-helpers.js";

// The exported ForestModel (raw thresholds, missingRight, category codes) read by
// an independent traversal written from scorer/model-types.ts must give every row
// the score the learner accumulated on the binned rows during training. This
// guards the raw-threshold mapping (x <= edge[b] in binning, x > threshold at scoring).
describe("raw-value scoring of the exported forest", () => {
  const data = mixedData(7, 3000);
  const binned = binFeatures(
    { rowCount: data.rows, numeric: data.numeric, categorical: data.categorical },
    { bins: 16, binSampleRows: 500, maxCategories: 32, seed: 3 },
  );
  // Contract codes of the native category: dictionary code -> position in the contract's values.
  const cropValues = binned.contract.categorical[0].values;
  const crop = Int32Array.from(data.categorical[0].codes, (code) =>
    code < 0 ? -1 : cropValues.indexOf(data.categorical[0].dictionary[code]),
  );
  const raw: RawColumns = {
    numeric: data.numeric.map((c) => c.values),
    categorical: [crop, new Int32Array(data.rows).fill(-1)],
  };

  it("matches the training scores on every row (tolerance 1e-12)", async () => {
    const [fitted] = await fitForests(binned, [{ outcome: "y", label: data.label }], {
      settings: {
        ...plainSettings,
        count: 25,
        depth: 4,
        leaves: 12,
        learningRate: 0.3,
        l2: 1,
        rowFraction: 0.7,
        featureFraction: 0.8,
        validationFraction: 0.2,
      },
      seed: 5,
      workers: 1,
      returnScores: true,
    });
    expect(binned.contract.categorical[1].values).toEqual([]); // 300 values: left to the heads
    const scores = fitted.scores as Float64Array;
    const usedCategory = fitted.forest.trees.some((t) => t.rightCategories.some((c) => c !== null));
    expect(usedCategory).toBe(true);
    for (let r = 0; r < data.rows; r++) {
      expect(Math.abs(scoreRaw(fitted.forest, raw, r) - scores[r])).toBeLessThan(1e-12);
    }
  });

  it("matches after early stopping cut the forest back", async () => {
    const [fitted] = await fitForests(binned, [{ outcome: "y", label: data.label }], {
      settings: {
        ...plainSettings,
        count: 60,
        depth: 5,
        learningRate: 1,
        l2: 0.1,
        leaves: 32,
        validationFraction: 0.3,
        patience: 3,
      },
      seed: 2,
      workers: 1,
      timestamp: data.timestamp,
      returnScores: true,
    });
    expect(fitted.forest.trees.length).toBeLessThan(fitted.treesFitted);
    const scores = fitted.scores as Float64Array;
    for (let r = 0; r < data.rows; r++) {
      expect(Math.abs(scoreRaw(fitted.forest, raw, r) - scores[r])).toBeLessThan(1e-12);
    }
  });

  // Eight numeric columns and no validation rows: bins move as whole 32-bit words
  // and every training row is placed straight from the gradient round, the bench's path.
  it("matches with 8 numeric columns, all rows training, on 1 and 2 workers", async () => {
    const random = testRandom(11);
    const rows = 4000;
    const numeric = Array.from({ length: 8 }, (_, f) => ({
      name: `x${f}`,
      values: Float64Array.from({ length: rows }, () => random()),
    }));
    const label = Uint8Array.from({ length: rows }, (_, r) =>
      random() < (numeric[0].values[r] + numeric[3].values[r]) / 2 ? 1 : 0,
    );
    const wide = binFeatures(
      { rowCount: rows, numeric, categorical: [] },
      { bins: 32, binSampleRows: 1000, maxCategories: 32, seed: 1 },
    );
    const fit = (workers: number) =>
      fitForests(wide, [{ outcome: "y", label }], {
        settings: { ...plainSettings, count: 8, depth: 5, leaves: 32, learningRate: 0.3, l2: 1 },
        seed: 4,
        workers,
        returnScores: true,
        blockRows: 500,
      });
    const [one] = await fit(1);
    const [two] = await fit(2);
    expect(two.forest).toEqual(one.forest);
    expect(Array.from(two.scores as Float64Array)).toEqual(Array.from(one.scores as Float64Array));
    const rawWide: RawColumns = { numeric: numeric.map((c) => c.values), categorical: [] };
    const scores = one.scores as Float64Array;
    for (let r = 0; r < rows; r++) {
      expect(Math.abs(scoreRaw(one.forest, rawWide, r) - scores[r])).toBeLessThan(1e-12);
    }
  });
});
