import { describe, expect, it } from "vitest";
import { columnsFromItems } from "../../scorer/columns-from-items.js";
import { compileForest } from "../../scorer/compile-forest.js";
import { treeGroup } from "../../scorer/tree-group.js";
import { VirtualSlots } from "../../scorer/virtual-slots.js";
import { createScorer } from "../../scorer/create-scorer.js";
import { loadScorer } from "../../scorer/load-scorer.js";
import type { ScoringModel } from "../../scorer/model-types.js";
import { buildArtifact } from "../../trainer/artifact/build-artifact.js";
import { formatArtifactText } from "../../trainer/artifact/format-artifact-text.js";
import { syntheticItems } from "../../trainer/artifact/synthetic-items.js";
import { syntheticModel } from "../../trainer/artifact/synthetic-model.js";
import { asScoringModel, mixedItems, mixedModel, smallModel } from "./fixtures.js";
import { referenceScore } from "./reference-model.js";

// The parity bound: runtime probabilities within 1e-12 of the in-memory model.
const TOLERANCE = 1e-12;

function maxDifference(
  model: ScoringModel,
  items: ReturnType<typeof syntheticItems>,
  scores: { probability: Readonly<Record<string, Float64Array>>; combined: Float64Array },
): number {
  let worst = 0;
  items.forEach((item, i) => {
    const reference = referenceScore(model, item);
    model.heads.forEach((head, h) => {
      worst = Math.max(
        worst,
        Math.abs(scores.probability[head.outcome][i] - reference.probability[h]),
      );
    });
    worst = Math.max(
      worst,
      Math.abs(scores.combined[i] - reference.combined) / Math.max(1, Math.abs(reference.combined)),
    );
  });
  return worst;
}

describe("parity with a plain in-memory reference", () => {
  const manySplits = asScoringModel(
    syntheticModel({ trees: 6, depth: 6, categoricalShare: 0.6, hashBits: 10, seed: 5 }),
  );
  const cases: [string, ScoringModel, ReturnType<typeof syntheticItems>, string[]][] = [
    [
      "few categorical splits (virtual slots, numeric kernel)",
      asScoringModel(smallModel()),
      syntheticItems(400, 8),
      ["numeric"],
    ],
    [
      "many categorical splits on small features (one-hot kernel)",
      manySplits,
      syntheticItems(400, 9),
      ["one-hot"],
    ],
    [
      "three forests of depths 5, 3, 6 with a 40-value categorical (bitset kernel)",
      mixedModel(),
      mixedItems(400),
      ["numeric", "bitset", "bitset"],
    ],
  ];

  for (const [name, model, items, kernels] of cases) {
    it(`${name}: scoreOne, scoreItems and scoreBatch agree within 1e-12`, () => {
      const virtual = VirtualSlots.plan(model.forests, model.contract);
      expect(
        model.forests.map((forest) => compileForest(forest, model.contract, virtual).kernel),
      ).toEqual(kernels);
      const scorer = createScorer(model);
      const one = {
        probability: Object.fromEntries(
          model.heads.map((head) => [head.outcome, new Float64Array(items.length)]),
        ),
        combined: new Float64Array(items.length),
      };
      items.forEach((item, i) => {
        const result = scorer.scoreOne(item);
        for (const head of model.heads)
          one.probability[head.outcome][i] = result.probability[head.outcome];
        one.combined[i] = result.combined;
      });
      expect(maxDifference(model, items, one)).toBeLessThanOrEqual(TOLERANCE);
      expect(maxDifference(model, items, scorer.scoreItems(items))).toBeLessThanOrEqual(TOLERANCE);
      expect(
        maxDifference(model, items, scorer.scoreBatch(columnsFromItems(scorer.features, items))),
      ).toBeLessThanOrEqual(TOLERANCE);
    });
  }

  it("any number of heads (1, 4, 7 and 9: every lane layout) agrees within 1e-12", () => {
    const outcomes = [
      "open",
      "react",
      "reply",
      "save",
      "reshare",
      "hide",
      "visit",
      "follow",
      "mute",
    ];
    for (const count of [1, 4, 7, 9]) {
      const model = asScoringModel(
        syntheticModel({
          trees: 10,
          depth: 3,
          hashBits: 8,
          hashedPerHead: 30,
          outcomes: outcomes.slice(0, count),
          seed: count,
        }),
      );
      const items = syntheticItems(60, count);
      expect(
        maxDifference(model, items, createScorer(model).scoreItems(items)),
      ).toBeLessThanOrEqual(TOLERANCE);
    }
  });

  it("deep trees (depth 10) take the heads kernel several tree groups per chunk, with the same sums", () => {
    const model = asScoringModel(
      syntheticModel({ trees: 12, depth: 10, hashBits: 8, hashedPerHead: 30, seed: 17 }),
    );
    expect(treeGroup(1 << 10, 6)).toBeLessThan(12);
    const items = syntheticItems(80, 17);
    expect(maxDifference(model, items, createScorer(model).scoreItems(items))).toBeLessThanOrEqual(
      TOLERANCE,
    );
  });

  it("an artifact round trip scores exactly as the in-memory model", () => {
    const model = mixedModel();
    const items = mixedItems(300);
    const fromModel = createScorer(model).scoreItems(items);
    const fromText = loadScorer(
      formatArtifactText(
        buildArtifact({ ...model, valueWeights: { open: 1, react: 2.5, hide: -7 } }),
      ),
    ).scoreItems(items);
    // Exact: the artifact holds every double as its shortest round-trip text.
    expect(Array.from(fromText.combined)).toEqual(Array.from(fromModel.combined));
    for (const head of model.heads)
      expect(Array.from(fromText.probability[head.outcome])).toEqual(
        Array.from(fromModel.probability[head.outcome]),
      );
    expect(maxDifference(model, items, fromText)).toBeLessThanOrEqual(TOLERANCE);
  });

  it("rank orders by the combined score, best first, ties by index", () => {
    const model = asScoringModel(smallModel());
    const scorer = createScorer(model);
    const items = syntheticItems(50, 21);
    const twice = [...items, ...items];
    const order = Array.from(scorer.rank(twice));
    const combined = twice.map((item) => referenceScore(model, item).combined);
    for (let k = 1; k < order.length; k++) {
      const [a, b] = [order[k - 1], order[k]];
      expect(
        combined[a] > combined[b] - TOLERANCE ||
          (Math.abs(combined[a] - combined[b]) <= TOLERANCE && a < b),
      ).toBe(true);
    }
    expect(Array.from(scorer.rank(columnsFromItems(scorer.features, twice)))).toEqual(order);
  });
});
