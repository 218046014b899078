import { describe, expect, it } from "vitest";
import { chooseDrops } from "../../trainer/pruning/choose-drops.js";
import { importanceOfForests } from "../../trainer/pruning/importance-of-forests.js";

// Hand-computed cases: the combined gain share is the mean over forests of each
// feature's share of its forest's total gain.
const forests = [
  {
    forest: "open",
    features: [
      { feature: "tie_strength", gain: 30, cover: 900, splits: 6 },
      { feature: "feed_position", gain: 10, cover: 400, splits: 3 },
      { feature: "noise_a", gain: 0, cover: 0, splits: 0 },
    ],
  },
  {
    forest: "reply",
    features: [
      { feature: "tie_strength", gain: 1, cover: 20, splits: 1 },
      { feature: "feed_position", gain: 0, cover: 0, splits: 0 },
      { feature: "noise_a", gain: 0, cover: 0, splits: 0 },
    ],
  },
];

describe("importanceOfForests", () => {
  it("sums gain, cover and splits, and averages each forest's gain share", () => {
    const { combined, unused, perForest } = importanceOfForests(forests);
    expect(combined.map((c) => c.feature)).toEqual(["tie_strength", "feed_position", "noise_a"]);
    const [tie, position, noise] = combined;
    // tie: (30/40 + 1/1) / 2 = 0.875; position: (10/40 + 0) / 2 = 0.125 (hand-computed).
    expect(tie.gainShare).toBeCloseTo(0.875, 12);
    expect(position.gainShare).toBeCloseTo(0.125, 12);
    expect(noise.gainShare).toBe(0);
    expect(tie).toMatchObject({ gain: 31, cover: 920, splits: 7, forestsUsing: 2 });
    expect(position).toMatchObject({ gain: 10, cover: 400, splits: 3, forestsUsing: 1 });
    expect(unused).toEqual(["noise_a"]);
    expect(perForest.map((f) => f.forest)).toEqual(["open", "reply"]);
  });

  it("gives every feature a share of 0 when no forest splits at all", () => {
    const { combined, unused } = importanceOfForests([
      { forest: "hide", features: [{ feature: "b", gain: 0, cover: 0, splits: 0 }] },
    ]);
    expect(combined[0].gainShare).toBe(0);
    expect(unused).toEqual(["b"]);
  });
});

describe("chooseDrops", () => {
  const { combined } = importanceOfForests(forests);
  it("drops unused and unknown features first, then the lowest gain share", () => {
    expect(chooseDrops(combined, ["tie_strength", "feed_position", "noise_a"], 1)).toEqual([
      "noise_a",
    ]);
    expect(
      chooseDrops(combined, ["tie_strength", "feed_position", "noise_a", "zz_new"], 3),
    ).toEqual(["noise_a", "zz_new", "feed_position"]);
  });

  it("only considers the droppable features and never returns more than asked", () => {
    expect(chooseDrops(combined, ["tie_strength"], 5)).toEqual(["tie_strength"]);
    expect(chooseDrops(combined, ["tie_strength", "noise_a"], 0)).toEqual([]);
  });
});
