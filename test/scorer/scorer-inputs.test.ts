import { describe, expect, it } from "vitest";
import type { ColumnarBatch } from "../../scorer/columnar-batch.js";
import { RowEncoder } from "../../scorer/row-encoder.js";
import { CategoryDictionary } from "../../trainer/data/category-dictionary.js";
import type { ColumnBatch, ColumnData } from "../../trainer/data/column-batch.js";
import { columnsFromItems } from "../../scorer/columns-from-items.js";
import { createScorer } from "../../scorer/create-scorer.js";
import type { ScoreItem } from "../../scorer/score-item.js";
import { ScorerError } from "../../scorer/scorer-error.js";
import { syntheticItems } from "../../trainer/artifact/synthetic-items.js";
import { asScoringModel, smallModel } from "./fixtures.js";

describe("scorer inputs", () => {
  const model = asScoringModel(smallModel());
  const scorer = createScorer(model);
  const item = syntheticItems(1, 3)[0];

  it("reads null, undefined, NaN and absent values as missing, and unseen categories as missing for the trees", () => {
    const missing: ScoreItem = {
      ...item,
      tie_strength: null,
      photo_count: NaN,
      post_kind: undefined,
    };
    const absent: Record<string, unknown> = { ...item };
    delete absent.tie_strength;
    delete absent.photo_count;
    delete absent.post_kind;
    expect(scorer.scoreOne(missing)).toEqual(scorer.scoreOne(absent as ScoreItem));
    // An unseen value still hashes (the heads may know it) but reaches the same leaves as a missing one.
    const unseen = scorer.traverseOne({ ...item, season: "monsoon" });
    const none = scorer.traverseOne({ ...item, season: null });
    expect(Array.from(unseen)).toEqual(Array.from(none));
  });

  it("reads a number given for a categorical feature as its text", () => {
    expect(scorer.scoreOne({ ...item, crop: 7 })).toEqual(scorer.scoreOne({ ...item, crop: "7" }));
  });

  it("refuses a value of the wrong type, naming the feature", () => {
    expect(() => scorer.scoreOne({ ...item, tie_strength: "0.4" })).toThrow(
      'item: /tie_strength: feature "tie_strength" expected a number or null, found "0.4"',
    );
    expect(() => scorer.scoreOne({ ...item, crop: true } as unknown as ScoreItem)).toThrow(
      'feature "crop" expected a string or null, found boolean true',
    );
    expect(() => scorer.scoreOne(null as unknown as ScoreItem)).toThrow(
      "item: expected an object of feature values, found null",
    );
    expect(() => columnsFromItems(scorer.features, [item, { ...item, photo_count: "3" }])).toThrow(
      /feature "photo_count" expected a number or null, found string \(item 1\)/,
    );
  });

  it("refuses a call from inside a scoring call and stays usable afterwards", () => {
    const sneaky = { ...item };
    Object.defineProperty(sneaky, "tie_strength", {
      enumerable: true,
      get: () => scorer.scoreOne(item).combined,
    });
    expect(() => scorer.scoreOne(sneaky)).toThrow(ScorerError);
    expect(() => scorer.scoreOne(sneaky)).toThrow(/one call at a time/);
    expect(scorer.scoreOne(item).combined).toBe(createScorer(model).scoreOne(item).combined);
  });

  it("writes into a caller's array without allocating a result", () => {
    const out = new Float64Array(scorer.outcomes.length);
    const combined = scorer.scoreOneInto(item, out);
    const result = scorer.scoreOne(item);
    expect(combined).toBe(result.combined);
    scorer.outcomes.forEach((outcome, h) => expect(out[h]).toBe(result.probability[outcome]));
  });

  it("fills reused outputs, and refuses outputs that are too small", () => {
    const items = syntheticItems(30, 4);
    const out = scorer.allocateScores(40);
    const again = scorer.scoreItems(items, out);
    expect(again).toBe(out);
    expect(Array.from(out.combined.subarray(0, 30))).toEqual(
      Array.from(scorer.scoreItems(items).combined),
    );
    expect(
      Array.from(
        scorer.scoreBatch(columnsFromItems(scorer.features, items), out).combined.subarray(0, 30),
      ),
    ).toEqual(Array.from(out.combined.subarray(0, 30)));
    expect(() => scorer.scoreItems(items, scorer.allocateScores(10))).toThrow(
      /expected a Float64Array of at least 30 entries/,
    );
  });

  it("scores an empty batch and an empty list", () => {
    expect(scorer.scoreItems([]).combined.length).toBe(0);
    expect(scorer.rank([]).length).toBe(0);
    expect(scorer.scoreBatch(columnsFromItems(scorer.features, [])).combined.length).toBe(0);
  });
});

describe("the trainer's column batches", () => {
  it("are columnar batches as they are: the scorer and the encoder take them directly", () => {
    const model = asScoringModel(smallModel());
    const scorer = createScorer(model);
    const items = syntheticItems(40, 12);
    const columns = new Map<string, ColumnData>();
    for (const name of model.contract.numeric) {
      columns.set(name, {
        kind: "number",
        values: Float64Array.from(items, (item) =>
          typeof item[name] === "number" ? (item[name] as number) : NaN,
        ),
      });
    }
    for (const { name } of model.contract.categorical) {
      const dictionary = new CategoryDictionary();
      const codes = Int32Array.from(items, (item) =>
        typeof item[name] === "string" ? dictionary.codeOf(item[name] as string) : -1,
      );
      columns.set(name, { kind: "category", codes, dictionary });
    }
    columns.set("open", { kind: "label", values: new Uint8Array(items.length) });
    const batch: ColumnBatch = { file: "impressions.csv", rowCount: items.length, columns };
    const asColumnar: ColumnarBatch = batch; // compiles: the shapes agree
    expect(Array.from(scorer.scoreBatch(asColumnar).combined)).toEqual(
      Array.from(scorer.scoreItems(items).combined),
    );
    const encoded = new RowEncoder(model).encode(batch);
    expect(encoded.rowCount).toBe(items.length);
  });
});
