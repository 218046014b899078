import { rm } from "node:fs/promises";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { learnHeadsFromFiles } from "../../trainer/pipeline/learn-heads-from-files.js";
import type { ResolvedSchema } from "../../trainer/schema/load-dataset-schema.js";
import { resolveTrainingConfig } from "../../trainer/schema/load-training-config.js";
import { fitTreesFromFile } from "../../trainer/trees/fit-trees-from-file.js";
import type { ForestFile } from "../../trainer/trees/forest-file.js";
import { heldOutFigures, type HeldOutFigures } from "./hybrid-quality.js";
import { plotlineDays, plotlineSchema } from "./pipeline-fixtures.js";

// What is checked, on the Plotline scenario (DEVELOPERS.md, "The Plotline scenario", no
// drift: no new post type, no layout change): the issue's targets for the hybrid
// (trees + FTRL heads) on held-out days, scored through the scorer's own path
// (createScorer over the forests, the exported heads and the state's encoding):
// - normalized entropy (He et al. 2014: mean log loss / H(training positive
//   rate), trainer/metrics normalizedEntropy) below the trees-only model's for
//   every outcome;
// - for the common outcomes (open 20 %, react 6 %), NE within 2 % of the NE of
//   the generator's true probabilities on the same rows (the best any model of
//   these columns can do), and calibration (mean predicted / observed rate, He
//   et al. 2014) within 0.97 to 1.03, also with negatives downsampled 10x and the
//   scorer's re-calibration q = p / (p + (1 - p) / w) (He et al. 2014).
//
// Data: 16 days of 40,000 impressions, 200 authors; 6 forests of 60 trees of depth
// 5 on days 1-2, heads on days 1-12, held out days 13-16 (160,000 rows: on 80,000,
// label noise alone moved react's observed rate by up to 2 %). alpha 0.005 (the
// config default is 0.01). The exported heads are a moving average of the weights
// (heads.averaging, half-life 20,000 rows; weight-average.ts).
//
// Measured with data seeds 1 to 6 (this file uses 3; HYBRID_SEED=n runs another):
//              all negatives kept                      negatives kept at 0.1
//   open   gap 0.75-0.95 %, calibration 0.994-1.019   gap 0.95-1.27 %, 0.989-1.011
//   react  gap 1.11-1.52 %, calibration 0.978-1.028   gap 1.28-1.71 %, 0.972-1.016
// and the hybrid beat trees-only for all six outcomes in all twelve runs (closest:
// open, NE 0.993 of trees-only, seed 3, downsampled). The true probabilities' own
// calibration on the held-out rows was 0.985-1.009 for react.
//
// What made react reach the targets, found while sizing this test (14 days, two
// held out, seeds 1-5):
// - 30 trees per forest left react's NE gap at 1.65-2.25 %; 60 trees gave
//   1.12-1.72 %. With 30 trees, depth 6 or trees on 4 days lowered it by 0.05 to
//   0.5 point (seeds 1, 3, 5: up to 2.19 % and 1.95 %); weight averaging or
//   tie_strength as a numeric head feature moved it by 0.1 point or less.
// - The latest weights' level follows the last few thousand rows: with ~360
//   active leaf coordinates per row, their per-coordinate steps add up. Exported
//   as they were, held-out calibration went 0.957-1.052 (react) and 0.961-1.025
//   (open). A moving average with a half-life of 20,000 rows (half a day,
//   snapshots every 2,500) gave 0.965-1.029 and 0.995-1.018, at a cost of under
//   0.07 NE points; half-lives of 40,000 to 120,000 rows (snapshots every 4,000)
//   did no better. Two held-out days carry up to 2 % of label noise in react's
//   observed rate, hence four held out here.
// - Under "recalibrate", a head whose predictions are less spread than the truth
//   is pulled down by the shift into the low-rate region (Jensen): downsampled
//   react runs 0-2 % below the same run with all negatives.
// Not targets here, for the record (seeds 1-6): reply (1.5 %) reaches NE gaps of
// 2.0-3.3 %, and save's calibration 0.98-1.12: save depends on the weekend,
// which trees fitted on two weekdays cannot see.
const OUTCOMES = ["open", "react", "reply", "save", "reshare", "hide"];

/** Per common outcome: the largest NE gap to the true probabilities and calibration distance from 1. */
interface Bounds {
  readonly neGap: number;
  readonly calibration: number;
}
/** The issue's targets: NE within 2 % of the true-probability NE, calibration 0.97 to 1.03. */
const ISSUE: Bounds = { neGap: 0.02, calibration: 0.03 };

let dir = "";
let paths: string[] = [];
let schema: ResolvedSchema;
let forests: ForestFile;
const configWith = (negativeKeepRate: number) =>
  resolveTrainingConfig({
    seed: 2,
    workers: 1,
    trees: { count: 60, depth: 5, bins: 64, outcomes: OUTCOMES, validationFraction: 0 },
    heads: {
      alpha: 0.005,
      averaging: { halfLifeRows: 20_000 },
      hashBits: 16,
      negativeKeepRate: Object.fromEntries(OUTCOMES.map((o) => [o, negativeKeepRate])),
    },
  });

beforeAll(async () => {
  ({ dir, paths } = await plotlineDays("leafcast-pipeline-ne-", {
    seed: Number(process.env.HYBRID_SEED ?? 3),
    days: 16,
    rowsPerDay: 40_000,
    newPostTypeDay: null,
    layoutChangeDay: null,
    authors: 200,
    viewers: 5000,
  }));
  schema = await plotlineSchema();
  forests = (await fitTreesFromFile(paths.slice(0, 2), schema, configWith(1))).forests;
}, 90_000);
afterAll(() => rm(dir, { recursive: true, force: true }));

async function heldOut(negativeKeepRate: number): Promise<HeldOutFigures[]> {
  const config = configWith(negativeKeepRate);
  const learned = await learnHeadsFromFiles(paths.slice(0, 12), schema, config, forests, {
    // One worker thread trains while this thread encodes the next batch; results are identical to workers: 0.
    workers: 1,
  });
  const trainingRate = new Map(learned.report.map((h) => [h.outcome, h.overall.positiveRate]));
  const figures = await heldOutFigures(
    paths.slice(12),
    schema,
    forests,
    learned.state,
    trainingRate,
  );
  report(figures, `held out, negatives kept at ${negativeKeepRate}`);
  return figures;
}

/** One line per outcome in the test log, so a run's figures can be compared with those above. */
function report(figures: readonly HeldOutFigures[], label: string): void {
  const line = (f: HeldOutFigures): string =>
    `${f.outcome} gap ${((f.hybridNe / f.trueNe - 1) * 100).toFixed(2)} % calibration ` +
    `${f.calibration.toFixed(3)} (true ${f.trueCalibration.toFixed(3)}), NE / trees-only ${(f.hybridNe / f.treesNe).toFixed(4)}`;
  console.log(`${label}:\n  ${figures.map(line).join("\n  ")}`);
}

function expectTargets(figures: readonly HeldOutFigures[], bounds: Bounds): void {
  for (const f of figures) {
    expect(f.hybridNe, `${f.outcome}: hybrid NE below trees-only`).toBeLessThan(f.treesNe);
  }
  for (const outcome of ["open", "react"] as const) {
    const f = figures.find((x) => x.outcome === outcome) as HeldOutFigures;
    const gap = f.hybridNe / f.trueNe - 1;
    expect(gap, `${outcome}: NE gap to the true probabilities`).toBeLessThan(bounds.neGap);
    expect(
      Math.abs(f.calibration - 1),
      `${outcome}: calibration (true probabilities' own: ${f.trueCalibration.toFixed(4)})`,
    ).toBeLessThan(bounds.calibration);
  }
}

describe("the hybrid on held-out Plotline days", () => {
  it("beats trees-only for every outcome and nears the true-probability NE", async () => {
    expectTargets(await heldOut(1), ISSUE);
  }, 60_000);

  it("stays calibrated with negatives downsampled 10x", async () => {
    expectTargets(await heldOut(0.1), ISSUE);
  }, 60_000);
});
