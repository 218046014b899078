/**
 * Shared pieces of the tree tests: settings for small fits, a seeded data
 * maker, and an independent raw-value scorer that follows the ForestModel
 * documentation in scorer/model-types.ts (not the learner's own code).
 */
import type { ForestModel } from "../../scorer/model-types.js";
import type { ForestSettings } from "../../trainer/trees/fit-forests.js";

/** One plain tree, no shrinkage, no regularization: the textbook setting. */
export const plainSettings: ForestSettings = {
  count: 1,
  depth: 1,
  leaves: 2,
  learningRate: 1,
  l2: 0,
  minLeafHessian: 0,
  minSplitGain: 0,
  rowFraction: 1,
  featureFraction: 1,
  validationFraction: 0,
  patience: 0,
};

/** A tiny seeded generator for test data (mulberry32, common practice). */
export function testRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Raw inputs of one row: numeric values (NaN = missing) and contract category codes (-1 = missing). */
export interface RawColumns {
  readonly numeric: readonly Float64Array[];
  readonly categorical: readonly Int32Array[];
}

/**
 * The forest's raw score (log-odds) of row r, by the rules of model-types.ts:
 * node i has children 2i + 1 and 2i + 2; feature -1 always goes left; a numeric
 * value goes right when x > threshold, a missing one when missingRight is 1; a
 * category goes right when its code is in rightCategories.
 */
export function scoreRaw(forest: ForestModel, raw: RawColumns, r: number): number {
  const numericCount = raw.numeric.length;
  const firstLeaf = 2 ** forest.depth - 1;
  let score = forest.baseLogit;
  for (const tree of forest.trees) {
    let node = 0;
    for (let d = 0; d < forest.depth; d++) {
      const f = tree.feature[node];
      let right = false;
      if (f >= 0 && f < numericCount) {
        const x = raw.numeric[f][r];
        right = Number.isNaN(x) ? tree.missingRight[node] === 1 : x > tree.threshold[node];
      } else if (f >= numericCount) {
        const code = raw.categorical[f - numericCount][r];
        const set = tree.rightCategories[node] ?? new Int32Array(0);
        right = code < 0 ? tree.missingRight[node] === 1 : set.includes(code);
      }
      node = 2 * node + 1 + (right ? 1 : 0);
    }
    score += tree.leafValue[node - firstLeaf];
  }
  return score;
}

export function sigmoid(x: number): number {
  return 1 / (1 + Math.exp(-x));
}

/** A seeded mixed dataset: numeric columns (x1 has 20 % missing), a 5-value category, a 300-value id. */
export interface MixedData {
  readonly rows: number;
  readonly numeric: { name: string; values: Float64Array }[];
  readonly categorical: { name: string; codes: Int32Array; dictionary: string[] }[];
  readonly label: Uint8Array;
  readonly timestamp: Float64Array;
}

export function mixedData(seed: number, rows: number): MixedData {
  const random = testRandom(seed);
  const x0 = new Float64Array(rows);
  const x1 = new Float64Array(rows);
  const x2 = new Float64Array(rows);
  const crop = new Int32Array(rows);
  const plot = new Int32Array(rows);
  const label = new Uint8Array(rows);
  const timestamp = new Float64Array(rows);
  const cropEffect = [1.2, -0.8, 0.4, -1.5, 0.9];
  for (let r = 0; r < rows; r++) {
    x0[r] = random() * 10;
    x1[r] = random() < 0.2 ? NaN : random() * 2 - 1;
    x2[r] = Math.round(random() * 20) / 4; // repeated values
    crop[r] = random() < 0.05 ? -1 : Math.floor(random() * 5);
    plot[r] = Math.floor(random() * 300);
    timestamp[r] = 1_700_000_000_000 + Math.floor(random() * 1e9);
    const logit =
      -1 +
      0.5 * Math.sin(x0[r]) +
      (Number.isNaN(x1[r]) ? 1 : x1[r]) +
      0.2 * x2[r] +
      (crop[r] < 0 ? 0 : cropEffect[crop[r]]);
    label[r] = random() < sigmoid(logit) ? 1 : 0;
  }
  return {
    rows,
    numeric: [
      { name: "x0", values: x0 },
      { name: "x1", values: x1 },
      { name: "x2", values: x2 },
    ],
    categorical: [
      { name: "crop", codes: crop, dictionary: ["leek", "kale", "bean", "onion", "chard"] },
      { name: "plot", codes: plot, dictionary: Array.from({ length: 300 }, (_, i) => `p${i}`) },
    ],
    label,
    timestamp,
  };
}
