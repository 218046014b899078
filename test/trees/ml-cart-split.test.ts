import { describe, expect, it } from "vitest";
import { binFeatures } from "../../trainer/trees/bin-features.js";
import { fitForests } from "../../trainer/trees/fit-forests.js";
import { loadMlCart } from "./load-ml-cart.js";
import { plainSettings, sigmoid, testRandom } from "./tree-test-helpers.js";

// Independent check: ml-cart (npm), a CART regression tree that picks the split with
// the least squared error. For the first boosting tree every hessian is the same
// p0 (1 - p0), so with l2 = 0 our gain GL^2/HL + GR^2/HR - G^2/H ranks splits exactly
// as variance reduction does on the gradients: both trees must split the same rows.
describe("a depth-1 tree against ml-cart's DecisionTreeRegression", () => {
  it.each([1, 2, 3])("picks ml-cart's feature and partition (data seed %i)", async (seed) => {
    const random = testRandom(seed);
    const rows = 240;
    const features = 5;
    const x = Array.from({ length: features }, () =>
      Float64Array.from({ length: rows }, () => random()),
    );
    const label = Uint8Array.from({ length: rows }, (_, r) =>
      random() < sigmoid(3 * x[seed % features][r] - 2 * x[(seed + 2) % features][r]) ? 1 : 0,
    );
    // 240 distinct values per feature fit in 255 bins: every ml-cart threshold is one of ours.
    const binned = binFeatures(
      {
        rowCount: rows,
        numeric: x.map((values, f) => ({ name: `x${f}`, values })),
        categorical: [],
      },
      { bins: 255, binSampleRows: rows, maxCategories: 32, seed: 1 },
    );
    const [fitted] = await fitForests(binned, [{ outcome: "y", label }], {
      settings: plainSettings,
      seed: 1,
      workers: 1,
    });
    const tree = fitted.forest.trees[0];

    const p0 = label.reduce((a, b) => a + b, 0) / rows;
    const gradients = Array.from(label, (y) => p0 - y);
    const { DecisionTreeRegression } = await loadMlCart();
    const cart = new DecisionTreeRegression({ maxDepth: 1 });
    cart.train(
      Array.from({ length: rows }, (_, r) => x.map((column) => column[r])),
      gradients,
    );

    expect(tree.feature[0]).toBe(cart.root.splitColumn);
    const f = tree.feature[0];
    for (let r = 0; r < rows; r++) {
      // ml-cart sends x < splitValue left; we send x > threshold right.
      expect(x[f][r] > tree.threshold[0]).toBe(!(x[f][r] < cart.root.splitValue));
    }
  });
});
