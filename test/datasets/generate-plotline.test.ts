import { describe, expect, it } from "vitest";
import { generatePlotline } from "../../datasets/plotline/generate-plotline.js";
import { fillPlotlineProbabilities } from "../../datasets/plotline/fill-plotline-probabilities.js";
import {
  PLOTLINE_COLUMN_NAMES,
  allocatePlotlineColumns,
} from "../../datasets/plotline/plotline-columns.js";
import { buildPlotlinePopulation } from "../../datasets/plotline/plotline-population.js";
import { resolvePlotlineOptions } from "../../datasets/plotline/plotline-options.js";
import {
  PLOT_TOUR,
  PLOTLINE_OUTCOMES,
  POST_TYPES,
} from "../../datasets/plotline/plotline-vocabulary.js";
import { LeafcastError } from "../../trainer/errors.js";

const DAY = 86400;
const START = Date.parse("2025-06-02T00:00:00Z") / 1000;

describe("generatePlotline", () => {
  it("draws each label with its true probability: |rate - mean p| < 4 standard errors on 1,000,000 rows", () => {
    // The binomial standard error of a sum of independent Bernoulli(p_i) draws is
    // sqrt(sum p_i (1 - p_i)) (common practice); 4 of them fail by chance about once in 16,000 runs.
    const n = 1_000_000;
    const sumP = new Float64Array(6);
    const sumVar = new Float64Array(6);
    const sumY = new Float64Array(6);
    let rows = 0;
    for (const chunk of generatePlotline({ seed: 11, rows: n })) {
      rows += chunk.rowCount;
      PLOTLINE_OUTCOMES.forEach((outcome, k) => {
        const p = chunk.columns[`true_${outcome}`];
        const y = chunk.columns[outcome];
        let sp = 0;
        let sv = 0;
        let sy = 0;
        for (let i = 0; i < chunk.rowCount; i++) {
          sp += p[i];
          sv += p[i] * (1 - p[i]);
          sy += y[i];
        }
        sumP[k] += sp;
        sumVar[k] += sv;
        sumY[k] += sy;
      });
    }
    expect(rows).toBe(n);
    const rates: Record<string, number> = {};
    PLOTLINE_OUTCOMES.forEach((outcome, k) => {
      rates[outcome] = sumY[k] / n;
      const z = (sumY[k] - sumP[k]) / Math.sqrt(sumVar[k]);
      expect(
        Math.abs(z),
        `${outcome}: ${sumY[k]} labels, ${sumP[k].toFixed(1)} expected`,
      ).toBeLessThan(4);
    });
    // Very different base rates: open common, reshare and hide rare (about 0.2-0.5 %).
    expect(rates.open).toBeGreaterThan(0.15);
    expect(rates.open).toBeLessThan(0.3);
    for (const rare of ["reshare", "hide"]) {
      expect(rates[rare]).toBeGreaterThan(0.002);
      expect(rates[rare]).toBeLessThan(0.005);
    }
  });

  it("computes each true probability from the row's observed columns alone", () => {
    // Rows shuffled into a fresh set of arrays, with the true probabilities cleared,
    // get the very same probabilities back from a freshly built population: no
    // hidden per-row state (random streams, row order) enters them.
    const options = { seed: 13, days: 42, rowsPerDay: 300 };
    const [chunk] = [...generatePlotline({ ...options, chunkRows: 42 * 300 })];
    const n = chunk.rowCount;
    const order = Array.from({ length: n }, (_, i) => (i * 7919) % n);
    const shuffled = allocatePlotlineColumns(n);
    for (const name of PLOTLINE_COLUMN_NAMES) {
      if (name.startsWith("true_")) continue;
      const from = chunk.columns[name];
      const to = shuffled[name];
      for (let i = 0; i < n; i++) to[i] = from[order[i]];
    }
    const resolved = resolvePlotlineOptions(options);
    fillPlotlineProbabilities(buildPlotlinePopulation(resolved), resolved, shuffled, 0, n);
    let mismatches = 0;
    for (const outcome of PLOTLINE_OUTCOMES) {
      const stored = chunk.columns[`true_${outcome}`];
      const again = shuffled[`true_${outcome}`];
      for (let i = 0; i < n; i++) if (again[i] !== stored[order[i]]) mismatches++;
    }
    expect(mismatches).toBe(0);
  });

  it("keeps rows in time order within the run's days, with labels correlated across outcomes", () => {
    let last = -Infinity;
    let outOfOrder = 0;
    let wrongHour = 0;
    let both = 0;
    let opens = 0;
    let reacts = 0;
    let n = 0;
    for (const chunk of generatePlotline({ seed: 3, days: 14, rowsPerDay: 5000 })) {
      const { timestamp, open, react, hour_of_day } = chunk.columns;
      for (let i = 0; i < chunk.rowCount; i++) {
        // Counted, not asserted per row: an expect per row would dominate the test's time.
        if (timestamp[i] < last) outOfOrder++;
        if (hour_of_day[i] !== Math.floor((timestamp[i] % DAY) / 3600)) wrongHour++;
        last = timestamp[i];
        both += open[i] & react[i];
        opens += open[i];
        reacts += react[i];
        n++;
      }
    }
    expect(n).toBe(70_000);
    expect(outOfOrder).toBe(0);
    expect(wrongHour).toBe(0);
    expect(last).toBeLessThan(START + 14 * DAY);
    // Shared drivers and the shared draw make react far likelier among opens than overall.
    expect(both / opens).toBeGreaterThan(2 * (reacts / n));
  });

  it("gives the same rows for the same seed whatever the chunk size, and other rows for another seed", () => {
    const collect = (options: Parameters<typeof generatePlotline>[0]) => {
      const parts: Record<string, number[]> = {};
      for (const chunk of generatePlotline(options)) {
        for (const name of PLOTLINE_COLUMN_NAMES) {
          (parts[name] ??= []).push(...Array.from(chunk.columns[name].subarray(0, chunk.rowCount)));
        }
      }
      return parts;
    };
    const a = collect({ seed: 5, days: 3, rowsPerDay: 3000 });
    const b = collect({ seed: 5, days: 3, rowsPerDay: 3000, chunkRows: 777 });
    const c = collect({ seed: 6, days: 3, rowsPerDay: 3000 });
    expect(b).toEqual(a);
    expect(c.true_open).not.toEqual(a.true_open);
    expect(c.viewer_id).not.toEqual(a.viewer_id);
  });

  it("introduces plot tours on their day, with video_seconds present for them only", () => {
    const seen = new Set<number>();
    let tours = 0;
    let videoMismatch = 0;
    for (const chunk of generatePlotline({ seed: 2, rowsPerDay: 2000 })) {
      const { timestamp, post_type, video_seconds } = chunk.columns;
      for (let i = 0; i < chunk.rowCount; i++) {
        const day = Math.floor((timestamp[i] - START) / DAY) + 1;
        const tour = post_type[i] === PLOT_TOUR;
        if (tour) {
          seen.add(day);
          tours++;
        }
        if (Number.isNaN(video_seconds[i]) === tour) videoMismatch++;
      }
    }
    expect(videoMismatch).toBe(0);
    expect(Math.min(...seen)).toBe(22);
    expect(seen.size).toBe(21);
    expect(tours).toBeGreaterThan(0.04 * 21 * 2000);
    // With the day switched off there is none at all.
    for (const chunk of generatePlotline({ seed: 2, rowsPerDay: 500, newPostTypeDay: null })) {
      expect(chunk.columns.post_type.includes(PLOT_TOUR)).toBe(false);
    }
  });

  it("shifts each outcome's logit by the layout shift from the layout day on, and only then", () => {
    // Features do not depend on the layout, so the two runs show the same rows.
    const options = { seed: 9, rowsPerDay: 400 } as const;
    const changed = [...generatePlotline(options)];
    const unchanged = [...generatePlotline({ ...options, layoutChangeDay: null })];
    const shift = resolvePlotlineOptions(options).layoutShift;
    const logit = (p: number) => Math.log(p / (1 - p));
    const meanGap = new Float64Array(6);
    let after = 0;
    let worstBefore = 0;
    let worstAfter = 0;
    changed.forEach((chunk, c) => {
      expect(chunk.columns.author_id).toEqual(unchanged[c].columns.author_id);
      for (let i = 0; i < chunk.rowCount; i++) {
        const day = Math.floor((chunk.columns.timestamp[i] - START) / DAY) + 1;
        PLOTLINE_OUTCOMES.forEach((outcome, k) => {
          const p1 = chunk.columns[`true_${outcome}`][i];
          const p0 = unchanged[c].columns[`true_${outcome}`][i];
          const gap = logit(p1) - logit(p0);
          if (day < 29) worstBefore = Math.max(worstBefore, Math.abs(gap));
          else worstAfter = Math.max(worstAfter, Math.abs(gap - shift[k]));
          if (day >= 29) meanGap[k] += gap;
        });
        if (day >= 29) after++;
      }
    });
    expect(after).toBe(14 * 400);
    expect(worstBefore).toBe(0);
    // Probabilities are stored on a 1e-9 grid, so the logit gap is exact up to
    // about 1e-9 / (p (1 - p)); 1e-3 covers p down to 1e-6.
    expect(worstAfter).toBeLessThan(1e-3);
    expect(meanGap[0] / after).toBeCloseTo(0.3, 3);
    expect(meanGap[5] / after).toBeCloseTo(-0.2, 3);
  });

  it("moves with the season: harvest photos rise and questions fall from the first to the last week", () => {
    // Shares among the five original types, so the plot tours of the last week do not dilute them.
    const share = (first: boolean) => {
      const counts = new Float64Array(POST_TYPES.length);
      let n = 0;
      for (const chunk of generatePlotline({ seed: 4, rowsPerDay: 3000 })) {
        const { timestamp, post_type } = chunk.columns;
        for (let i = 0; i < chunk.rowCount; i++) {
          const day = Math.floor((timestamp[i] - START) / DAY) + 1;
          if ((first ? day <= 7 : day >= 36) && post_type[i] !== PLOT_TOUR) {
            counts[post_type[i]]++;
            n++;
          }
        }
      }
      return Array.from(counts, (c) => c / n);
    };
    const early = share(true);
    const late = share(false);
    expect(late[0]).toBeGreaterThan(early[0] + 0.03); // harvest_photo
    expect(late[1]).toBeLessThan(early[1] - 0.02); // question
  });

  it("has realistic missing values", () => {
    let n = 0;
    const missing = { tie_strength: 0, distance_to_site_km: 0 };
    for (const chunk of generatePlotline({ seed: 8, days: 7, rowsPerDay: 5000 })) {
      for (const name of ["tie_strength", "distance_to_site_km"] as const) {
        const values = chunk.columns[name];
        for (let i = 0; i < chunk.rowCount; i++) if (Number.isNaN(values[i])) missing[name]++;
      }
      n += chunk.rowCount;
    }
    expect(missing.tie_strength / n).toBeGreaterThan(0.05);
    expect(missing.tie_strength / n).toBeLessThan(0.3);
    expect(missing.distance_to_site_km / n).toBeGreaterThan(0.05);
    expect(missing.distance_to_site_km / n).toBeLessThan(0.3);
  });

  it("refuses bad options with every problem named", () => {
    const error = (() => {
      try {
        resolvePlotlineOptions({
          days: 0,
          startDate: "2025-02-30",
          layoutShift: { clicks: 1 } as never,
        });
      } catch (e) {
        return e;
      }
    })();
    expect(error).toBeInstanceOf(LeafcastError);
    const messages = (error as LeafcastError).issues.map((i) => i.message);
    expect(messages).toEqual([
      'option "days" expected a whole number from 1 to 3650, found 0',
      'option "startDate" expected a date "YYYY-MM-DD", found "2025-02-30"',
      'option "layoutShift" expected keys open, react, reply, save, reshare, hide, found "clicks"',
    ]);
  });
});
