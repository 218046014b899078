import { describe, expect, it } from "vitest";
import { generatePlotline } from "../../datasets/plotline/generate-plotline.js";
import {
  PLOTLINE_COLUMN_NAMES,
  type PlotlineChunkColumns,
} from "../../datasets/plotline/plotline-columns.js";
import type { PlotlineOptions } from "../../datasets/plotline/plotline-options.js";
import {
  DEVICES,
  GARDEN_SITES,
  PLOTLINE_OUTCOMES,
  POST_TYPES,
  authorIds,
} from "../../datasets/plotline/plotline-vocabulary.js";
import { binFeatures } from "../../trainer/trees/bin-features.js";
import type { TreeInput } from "../../trainer/trees/binned-features.js";
import { fitForests } from "../../trainer/trees/fit-forests.js";
import { scoreRaw, testRandom, type RawColumns } from "./tree-test-helpers.js";

// The done-when check: on the Plotline scenario, trees-only normalized
// entropy on held-out rows of the fit window is within 5 % of the generator's
// true-probability NE on the same rows. NE = mean log loss / H(p), p the
// training rows' positive rate (He et al. 2014, see ../shared/check-values.md);
// both NEs share the denominator, so the check is a ratio of mean log losses.
//
// What was chosen, and why (about 12 s of CPU on this machine):
// - 14 days x 10,000 rows (140,000); held out: a seeded 20 % of the rows of the same
//   days (about 28,000). Two weeks cover the day-to-day season the generator puts in
//   the logits (the trees see it through the timestamp). With 8,000 rows a day react
//   came to 1.039, too close to the bound; with 10,000 the ratios measured on data
//   seeds 5, 6 and 7 were 1.010 to 1.014 for open and 1.015 to 1.026 for react.
// - No layout change and no new post type inside the window: the check is about how
//   well the trees fit the window, not about drift.
// - 24 authors: the generator adds a per-author effect to every logit (author_id is
//   observed). Trees split only low-cardinality categories natively (up to 32 here;
//   with thousands of authors that effect is left to the heads' hashed ids), so a
//   small author set keeps the whole truth within the trees' reach.
// - Outcomes open (about 18 % positive) and react (about 5 %): the common ones, with
//   enough positives among the held-out rows for a stable NE. The rare ones (reply,
//   save, reshare, hide; 0.3 to 2.5 %) need more rows than a unit test should fit.
// - 100 trees of depth 6 at learning rate 0.15, with L2 5 and at least 5 of hessian
//   per leaf (about 100 rows at react's rate): react overfit with L2 1 and 1 (1.032).
const SCENARIO: PlotlineOptions = {
  seed: 5,
  days: 14,
  rowsPerDay: 10_000,
  newPostTypeDay: null,
  layoutChangeDay: null,
  authors: 24,
  viewers: 3000,
};
const HELD_OUT = 0.2;

const CATEGORICAL = [
  { name: "post_type", dictionary: POST_TYPES },
  { name: "garden_site", dictionary: GARDEN_SITES },
  { name: "device", dictionary: DEVICES },
  { name: "author_id", dictionary: authorIds(SCENARIO.authors as number) },
] as const;
// Every generated column but ids, categories, outcomes and the true probabilities.
const NUMERIC = PLOTLINE_COLUMN_NAMES.filter(
  (name) =>
    name !== "viewer_id" &&
    !CATEGORICAL.some((c) => c.name === name) &&
    !(PLOTLINE_OUTCOMES as readonly string[]).includes(name) &&
    !name.startsWith("true_"),
);
const OUTCOMES = ["open", "react"] as const;

/** The scenario's rows as whole columns. */
function plotlineRows(): Record<string, Float64Array | Int32Array | Uint8Array> {
  const chunks = [...generatePlotline(SCENARIO)];
  const n = chunks.reduce((sum, chunk) => sum + chunk.rowCount, 0);
  const names = Object.keys(chunks[0].columns) as (keyof PlotlineChunkColumns)[];
  const out: Record<string, Float64Array | Int32Array | Uint8Array> = {};
  for (const name of names) {
    const first = chunks[0].columns[name];
    const Type = first.constructor as new (n: number) => typeof first;
    const column = new Type(n);
    let at = 0;
    for (const chunk of chunks) {
      column.set(chunk.columns[name].subarray(0, chunk.rowCount), at);
      at += chunk.rowCount;
    }
    out[name] = column;
  }
  return out;
}

function logLoss(p: number, y: number): number {
  return y === 1 ? -Math.log(p) : -Math.log(1 - p);
}

describe("trees-only normalized entropy on the Plotline scenario", () => {
  const all = plotlineRows();
  const n = (all.timestamp as Float64Array).length;
  const random = testRandom(17);
  const heldOut = Uint8Array.from({ length: n }, () => (random() < HELD_OUT ? 1 : 0));
  const trainRows: number[] = [];
  const testRows: number[] = [];
  for (let r = 0; r < n; r++) (heldOut[r] === 1 ? testRows : trainRows).push(r);
  const take = <T extends Float64Array | Int32Array | Uint8Array>(column: T, rows: number[]): T => {
    const Type = column.constructor as new (n: number) => T;
    const out = new Type(rows.length);
    rows.forEach((r, i) => (out[i] = column[r]));
    return out;
  };
  const numeric = (rows: number[]): Float64Array[] =>
    NUMERIC.map((name) => Float64Array.from(take(all[name], rows)));
  const codes = (rows: number[]): Int32Array[] =>
    CATEGORICAL.map(({ name }) => take(all[name] as Int32Array, rows));
  const trainInput: TreeInput = {
    rowCount: trainRows.length,
    numeric: numeric(trainRows).map((values, i) => ({ name: NUMERIC[i], values })),
    categorical: codes(trainRows).map((c, i) => ({
      name: CATEGORICAL[i].name,
      codes: c,
      dictionary: [...CATEGORICAL[i].dictionary],
    })),
  };
  const testRaw: RawColumns = { numeric: numeric(testRows), categorical: codes(testRows) };

  it("is within 5 % of the true-probability NE on held-out rows, for open and react", async () => {
    const binned = binFeatures(trainInput, {
      bins: 255,
      binSampleRows: 50_000,
      maxCategories: 32,
      seed: 1,
    });
    const targets = OUTCOMES.map((outcome) => ({
      outcome,
      label: take(all[outcome] as Uint8Array, trainRows),
    }));
    const fitted = await fitForests(binned, targets, {
      settings: {
        count: 100,
        depth: 6,
        leaves: 64,
        learningRate: 0.15,
        l2: 5,
        minLeafHessian: 5,
        minSplitGain: 0,
        rowFraction: 1,
        featureFraction: 1,
        validationFraction: 0,
        patience: 0,
      },
      seed: 3,
      workers: 2,
    });
    OUTCOMES.forEach((outcome, k) => {
      const label = all[outcome] as Uint8Array;
      const truth = all[`true_${outcome}`] as Float64Array;
      const positiveRate = targets[k].label.reduce((s, y) => s + y, 0) / trainRows.length;
      const entropy =
        logLoss(positiveRate, 1) * positiveRate + logLoss(positiveRate, 0) * (1 - positiveRate);
      let treeLoss = 0;
      let trueLoss = 0;
      testRows.forEach((r, i) => {
        const p = 1 / (1 + Math.exp(-scoreRaw(fitted[k].forest, testRaw, i)));
        treeLoss += logLoss(p, label[r]);
        trueLoss += logLoss(truth[r], label[r]);
      });
      const treeNe = treeLoss / testRows.length / entropy;
      const trueNe = trueLoss / testRows.length / entropy;
      // Tolerance 5 % relative, the bound (ratios near 1.01 to 1.03 measured here).
      expect(
        Math.abs(treeNe / trueNe - 1),
        `${outcome}: trees NE ${treeNe}, true NE ${trueNe}`,
      ).toBeLessThan(0.05);
    });
  }, 120_000);
});
