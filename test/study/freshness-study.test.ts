import { mkdtemp, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { writePlotlineDays } from "../../datasets/plotline/write-plotline-days.js";
import { recoveryShares } from "../../trainer/report/recovery-shares.js";
import type { FreshnessArm } from "../../trainer/report/report-input.js";
import { loadDatasetSchema } from "../../trainer/schema/load-dataset-schema.js";
import { resolveTrainingConfig } from "../../trainer/schema/load-training-config.js";
import { runFreshnessStudy, type FreshnessStudy } from "../../trainer/study/run-freshness-study.js";

// What the Plotline generator builds in (datasets/plotline/fill-plotline-probabilities.ts,
// fill-plotline-context.ts and DEVELOPERS.md "Drift across days"), moved to early days
// so the run stays small:
// - From NEW_TYPE_DAY authors post plot tours (4 % of the feed, ramping towards 12 %).
//   Their open, react and save depend on video_seconds (opens peak near 35 s, reactions
//   follow tie strength on tours of 60 s or less, saves jump past 120 s); video_seconds
//   is missing on every row before that day, so trees fit earlier cannot split on it,
//   and plot_tour is an unseen post_type value that the old trees send down their
//   missing-value branches (their leaf shares shift).
// - From LAYOUT_DAY every outcome's log-odds moves by a fixed amount (open +0.3,
//   react +0.1, save +0.15, reply 0) while the features stay the same: a base-rate drift
//   that re-learning the heads' weights can follow.
// The checks are on open, react and save: the outcomes with a forest here (a positive
// rate of at least trees.minForestRate, 2 %), and the ones both drifts move.
const NEW_TYPE_DAY = 6;
const LAYOUT_DAY = 10;
const FIT_DAYS = 3;
const WINDOW_DAYS = 2;
const OUTCOMES = ["open", "react", "save"];

let dir = "";
let paths: string[] = [];
let study: FreshnessStudy;
const config = resolveTrainingConfig({
  seed: 3,
  workers: 1,
  trees: { count: 20, depth: 4, bins: 64, validationFraction: 0 },
  heads: { alpha: 0.05, hashBits: 14 },
});

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), "leafcast-study-"));
  const written = await writePlotlineDays(dir, "parquet", {
    seed: 5,
    days: 15,
    rowsPerDay: 5000,
    newPostTypeDay: NEW_TYPE_DAY,
    layoutChangeDay: LAYOUT_DAY,
    authors: 200,
    viewers: 3000,
  });
  paths = written.map((w) => w.path);
  study = await runFreshnessStudy(
    paths,
    await loadDatasetSchema("datasets/plotline.schema.json"),
    config,
    {
      fitDays: FIT_DAYS,
      windowDays: WINDOW_DAYS,
      // Every earlier file: the refit arm's heads see exactly the updated heads' rows,
      // so the two arms differ only in their trees.
      refitDays: "all",
      // Windows from the one after the change's: every day they score, the updated heads have learned post-layout days.
      driftFromDay: LAYOUT_DAY + WINDOW_DAYS,
      segmentColumn: "post_type",
      baselines: false,
      workers: 0,
    },
  );
}, 180_000);
afterAll(() => rm(dir, { recursive: true, force: true }));

/** Mean NE of an arm over the given windows, on all rows or on one post type's rows. */
function meanNe(outcome: string, arm: FreshnessArm, windows: number[], segment?: string): number {
  const figures =
    segment === undefined
      ? study.figures
      : study.segmentFigures.filter((f) => f.segment === segment);
  const ne = windows.map(
    (w) => figures.find((f) => f.outcome === outcome && f.arm === arm && f.window === w)?.ne,
  );
  expect(ne.every((x) => x !== undefined && Number.isFinite(x))).toBe(true);
  return (ne as number[]).reduce((a, b) => a + b, 0) / ne.length;
}

function windowsFrom(day: number): number[] {
  return study.windows.flatMap((w, i) => (w.firstDay >= day ? [i] : []));
}

describe("the freshness study on Plotline", () => {
  it("cuts the days into the fit span and two-day windows", () => {
    expect(study.fitLabel).toBe("days 1-3");
    expect(study.windows.map((w) => w.label)).toEqual([
      "days 4-5",
      "days 6-7",
      "days 8-9",
      "days 10-11",
      "days 12-13",
      "days 14-15",
    ]);
    expect(study.figures).toHaveLength(6 * 3 * study.outcomes.length);
    expect(study.figures.every((f) => f.rows === 10_000)).toBe(true);
  });

  it("shows head updates recovering most of the NE lost to the layout change", () => {
    expect(study.recoveryWindows).toEqual(windowsFrom(LAYOUT_DAY + WINDOW_DAYS));
    for (const outcome of OUTCOMES) {
      const r = study.recovery.find((x) => x.outcome === outcome);
      const shares = r === undefined ? null : recoveryShares(r);
      expect(shares, outcome).not.toBeNull();
      // Frozen heads lose NE; the updated heads sit much closer to the refit arm than
      // to the frozen one: they win back over half of what was lost.
      expect(shares?.lost, outcome).toBeGreaterThan(0.01);
      expect(shares?.recovered, outcome).toBeGreaterThan(0.5);
    }
    // The base-rate drift itself: open's log-odds rose by 0.3 (about 20 % -> 24.6 %), so
    // frozen heads under-predict (calibration, predicted / observed as He et al. 2014
    // define it, about 0.8); updated heads follow: at least twice as close to 1.
    for (const w of study.recoveryWindows) {
      const cal = (arm: FreshnessArm): number =>
        study.figures.find((f) => f.outcome === "open" && f.arm === arm && f.window === w)
          ?.calibration ?? NaN;
      expect(cal("frozen")).toBeLessThan(0.9);
      expect(Math.abs(cal("heads-updated") - 1)).toBeLessThan(Math.abs(cal("frozen") - 1) / 2);
    }
  });

  it("leaves a gap on the new post type that only refitting the trees closes", () => {
    // Windows whose refit span already holds plot tours (refitting before the first
    // tour cannot help). On the tours' own rows, since they are 4 % to 10 % of these
    // windows and the gap is diluted to a few thousandths of NE over all rows.
    const after = windowsFrom(NEW_TYPE_DAY + WINDOW_DAYS);
    for (const outcome of OUTCOMES) {
      const refit = meanNe(outcome, "trees-refit", after, "plot_tour");
      const updated = meanNe(outcome, "heads-updated", after, "plot_tour");
      expect(refit, outcome).toBeLessThan(updated);
    }
  });

  it("updates the heads day by day, each day scored before they learn it", async () => {
    // Updated heads score a day having learned every earlier day and no later one,
    // whatever the window size, so with one-day windows they give the same
    // predictions: the same summaries over all scored rows, to the bit.
    const daily = await runFreshnessStudy(
      paths,
      await loadDatasetSchema("datasets/plotline.schema.json"),
      config,
      { fitDays: FIT_DAYS, windowDays: 1, refitDays: 1, baselines: false, workers: 0 },
    );
    expect(daily.windows).toHaveLength(12);
    expect(daily.heads.map((h) => h.overall)).toEqual(study.heads.map((h) => h.overall));
  }, 120_000);

  it("sees the frozen trees' leaf PSI rise once the new post type appears", () => {
    const before = study.windows.flatMap((w, i) => (w.lastDay < NEW_TYPE_DAY ? [i] : []));
    const after = windowsFrom(NEW_TYPE_DAY);
    expect(before.length).toBeGreaterThan(0);
    const mean = (values: number[]): number => values.reduce((a, b) => a + b, 0) / values.length;
    let ratio = 0;
    for (const series of study.staleness.forests) {
      const psiBefore = mean(before.map((w) => series.perWindow[w].forest));
      const psiAfter = mean(after.map((w) => series.perWindow[w].forest));
      expect(psiAfter, series.forest).toBeGreaterThan(psiBefore);
      ratio += psiAfter / psiBefore / study.staleness.forests.length;
    }
    expect(ratio).toBeGreaterThan(1.5);
    expect(study.staleness.verdict?.refit).toBe(false);
  });
});
