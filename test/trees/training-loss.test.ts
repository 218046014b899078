import { describe, expect, it } from "vitest";
import { binFeatures } from "../../trainer/trees/bin-features.js";
import { fitForests, type TreeProgress } from "../../trainer/trees/fit-forests.js";
import { mixedData, plainSettings } from "./tree-test-helpers.js";

// Newton boosting with shrinkage takes a descent step on the training loss with
// every tree, so the training loss falls tree after tree (common practice).
describe("training loss", () => {
  it("falls monotonically, and progress reports every tree", async () => {
    const data = mixedData(3, 4000);
    const binned = binFeatures(
      { rowCount: data.rows, numeric: data.numeric, categorical: data.categorical },
      { bins: 64, binSampleRows: 4000, maxCategories: 32, seed: 1 },
    );
    const progress: TreeProgress[] = [];
    const [fitted] = await fitForests(binned, [{ outcome: "y", label: data.label }], {
      settings: {
        ...plainSettings,
        count: 40,
        depth: 4,
        leaves: 16,
        learningRate: 0.2,
        l2: 1,
        validationFraction: 0.2,
      },
      seed: 1,
      workers: 1,
      onProgress: (p) => progress.push(p),
    });
    const losses = [fitted.startTrainLoss, ...fitted.trainLoss];
    for (let t = 1; t < losses.length; t++) expect(losses[t]).toBeLessThan(losses[t - 1]);
    expect(progress).toHaveLength(40);
    expect(progress[39]).toMatchObject({
      outcome: "y",
      forest: 1,
      forests: 1,
      tree: 40,
      trees: 40,
      secondsLeft: 0,
    });
    expect(progress[39].trainLoss).toBe(fitted.trainLoss[39]);
    expect(progress[39].validationLoss).toBe((fitted.validationLoss as Float64Array)[39]);
    // The held-out loss also improves on the start (the data has signal).
    expect((fitted.validationLoss as Float64Array)[39]).toBeLessThan(
      fitted.startValidationLoss as number,
    );
  });
});
