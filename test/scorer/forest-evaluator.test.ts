import { describe, expect, it } from "vitest";
import type { ForestColumns, ForestRows } from "../../scorer/forest-input.js";
import { ForestEvaluator } from "../../scorer/forest-evaluator.js";
import type { FeatureContract } from "../../scorer/model-types.js";
import type { ScoreItem } from "../../scorer/score-item.js";
import { ScorerError } from "../../scorer/scorer-error.js";
import { syntheticItems } from "../../trainer/artifact/synthetic-items.js";
import { mixedItems, mixedModel, smallModel } from "./fixtures.js";
import { referenceLeaf } from "./reference-model.js";

/** The same items as contract-coded columns and as contract-coded rows. */
function contractInputs(
  contract: FeatureContract,
  items: readonly ScoreItem[],
): { columns: ForestColumns; rows: ForestRows } {
  const { numeric, categorical } = contract;
  const F = numeric.length + categorical.length;
  const code = (values: readonly string[], value: unknown): number => {
    const text =
      typeof value === "string"
        ? value
        : typeof value === "number" && Number.isFinite(value)
          ? String(value)
          : null;
    return text === null ? -1 : values.indexOf(text);
  };
  const columns = {
    rowCount: items.length,
    numeric: numeric.map((name) =>
      Float64Array.from(items, (item) =>
        typeof item[name] === "number" ? (item[name] as number) : NaN,
      ),
    ),
    categorical: categorical.map((feature) =>
      Int32Array.from(items, (item) => code(feature.values, item[feature.name])),
    ),
  };
  const values = new Float64Array(items.length * F);
  items.forEach((_, i) => {
    numeric.forEach((_, f) => (values[i * F + f] = columns.numeric[f][i]));
    categorical.forEach((_, c) => {
      const k = columns.categorical[c][i];
      values[i * F + numeric.length + c] = k < 0 ? NaN : k;
    });
  });
  return { columns, rows: { rowCount: items.length, values } };
}

describe("ForestEvaluator", () => {
  const cases = [
    { name: "mixed", model: mixedModel(), items: mixedItems(260) }, // several chunks of rows
    { name: "small (virtual slots)", model: smallModel(), items: syntheticItems(100, 3) },
  ];
  for (const { name, model, items } of cases) {
    const { columns, rows } = contractInputs(model.contract, items);
    const F = model.contract.numeric.length + model.contract.categorical.length;
    for (const [f, forest] of model.forests.entries()) {
      it(`${name} forest ${f} (depth ${forest.depth}): leaves and raw scores equal recursive traversal, for columns and rows`, () => {
        const evaluator = new ForestEvaluator(forest, model.contract);
        const fromColumns = evaluator.leaves(columns);
        expect(Array.from(evaluator.leaves(rows))).toEqual(Array.from(fromColumns));
        const raw = evaluator.rawScores(columns);
        items.forEach((item, i) => {
          let sum = forest.baseLogit;
          forest.trees.forEach((tree, t) => {
            const leaf = referenceLeaf(tree, forest.depth, model, item);
            expect(fromColumns[i * forest.trees.length + t]).toBe(leaf);
            sum += tree.leafValue[leaf];
          });
          // Summed in the same order (base, then tree by tree): exactly equal.
          expect(raw[i]).toBe(sum);
        });
        const one = evaluator.leaves({ rowCount: 1, values: rows.values.subarray(0, F) });
        expect(Array.from(one)).toEqual(Array.from(fromColumns.subarray(0, forest.trees.length)));
      });
    }
  }

  it("refuses a broken forest and a wrongly shaped input", () => {
    const model = mixedModel();
    const forest = model.forests[0];
    const broken = { ...forest, trees: [{ ...forest.trees[0], leafValue: new Float64Array(3) }] };
    expect(() => new ForestEvaluator(broken, model.contract)).toThrow(
      /forest: \/forests\/0\/trees\/0\/leafValue: expected 32 entries for depth 5, found 3/,
    );
    const evaluator = new ForestEvaluator(forest, model.contract);
    expect(() => evaluator.leaves({ rowCount: 2, numeric: [], categorical: [] })).toThrow(
      ScorerError,
    );
  });
});
