/** Models and items shared by the scorer tests (invented Plotline data). */
import type { ScoringModel } from "../../scorer/model-types.js";
import type { ScoreItem } from "../../scorer/score-item.js";
import { buildArtifact } from "../../trainer/artifact/build-artifact.js";
import { syntheticItems } from "../../trainer/artifact/synthetic-items.js";
import { syntheticModel, type SyntheticModel } from "../../trainer/artifact/synthetic-model.js";
import { gaussian, seededRandom } from "../../trainer/artifact/synthetic-random.js";
import { encodedLayout } from "../../scorer/encoded-layout.js";

/** A SyntheticModel as a ScoringModel (value weights per head). */
export function asScoringModel(model: SyntheticModel): ScoringModel {
  return {
    ...model,
    valueWeights: model.heads.map((head) => model.valueWeights[head.outcome] ?? 1),
  };
}

/** A small model: 20 trees of depth 4, one-hot categorical splits. */
export function smallModel(seed = 3): SyntheticModel {
  return syntheticModel({ trees: 20, depth: 4, seed, hashBits: 10, hashedPerHead: 60 });
}

/**
 * Three forests of different depths (5, 3, 6), one with splits on a 40-value
 * categorical feature (the bitset kernel), heads redrawn over the combined layout.
 */
export function mixedModel(): ScoringModel {
  const a = syntheticModel({ trees: 13, depth: 5, seed: 11, categoricalShare: 0 });
  const b = syntheticModel({ trees: 9, depth: 3, seed: 12, categoricalShare: 0.3 });
  const c = syntheticModel({ trees: 11, depth: 6, seed: 13, categoricalShare: 0.3 });
  const soil = a.contract.categorical.findIndex((f) => f.name === "soil");
  const wide = Array.from({ length: 40 }, (_, k) =>
    k < 6 ? a.contract.categorical[soil].values[k] : `soil-${k}`,
  );
  const contract = {
    numeric: a.contract.numeric,
    categorical: a.contract.categorical.map((f, j) =>
      j === soil ? { name: f.name, values: wide } : f,
    ),
  };
  const forests = [
    { ...a.forests[0], outcome: "open" },
    { ...b.forests[0], outcome: "reply" },
    { ...c.forests[0], outcome: "hide" },
  ];
  // Make tree 0 of the third forest split on a high soil code, so codes past 31 matter.
  const tree = forests[2].trees[0];
  tree.feature[0] = contract.numeric.length + soil;
  (tree.rightCategories as (Int32Array | null)[])[0] = Int32Array.of(2, 33, 39);
  const layout = encodedLayout(forests, a.encoding);
  const random = seededRandom(5);
  const heads = ["open", "react", "hide"].map((outcome, h) => {
    const entries = new Map<number, number>();
    for (let k = 0; k < layout.leafCount; k++)
      if (random() < 0.6) entries.set(k, gaussian(random) * 0.3);
    for (let k = 0; k < 300; k++)
      entries.set(
        layout.hashedOffset + Math.floor(random() * layout.hashedCount),
        gaussian(random),
      );
    entries.set(layout.numericOffset, 0.2);
    entries.set(layout.numericOffset + 1, -0.1);
    const index = Int32Array.from([...entries.keys()].sort((x, y) => x - y));
    return {
      outcome,
      bias: -1 - h,
      index,
      weight: Float64Array.from(index, (i) => entries.get(i) ?? 0),
      negativeKeepRate: h === 0 ? 1 : 0.1,
    };
  });
  return { contract, forests, encoding: a.encoding, heads, valueWeights: [1, 2.5, -7] };
}

/** Items for mixedModel: the synthetic ones plus wide soil values, a numeric category and odd values. */
export function mixedItems(count: number): ScoreItem[] {
  const random = seededRandom(9);
  return syntheticItems(count, 4).map((item, i) => {
    const extra: Record<string, number | string | null | undefined> = { ...item };
    if (i % 3 === 0) extra.soil = `soil-${Math.floor(random() * 40)}`;
    if (i % 7 === 0) extra.season = undefined;
    if (i % 11 === 0) extra.tie_strength = NaN;
    if (i % 13 === 0) extra.post_kind = 42; // a number read as the text "42"
    if (i % 17 === 0) extra.caption_words = Infinity;
    if (i % 19 === 0) extra.crop = "grünkohl 🥬";
    return extra;
  });
}

/** The 100-tree, depth-6, six-head artifact of the benchmark. */
export function benchArtifact(): ReturnType<typeof buildArtifact> {
  return buildArtifact(syntheticModel({ trees: 100, depth: 6 }));
}
