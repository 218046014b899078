import type { PlotlineChunkColumns } from "./plotline-columns.js";
import {
  VIEWER_DEVICE,
  VIEWER_HOME,
  VIEWER_STRIDE,
  type PlotlinePopulation,
} from "./plotline-population.js";
import { PLOT_TOUR } from "./plotline-vocabulary.js";

/** Relative traffic per hour (UTC, the sites' clock): a morning and an evening peak. */
const WEEKDAY_TRAFFIC = [
  0.25, 0.12, 0.08, 0.08, 0.12, 0.35, 0.9, 1.7, 1.8, 1.3, 1.0, 1.0, 1.3, 1.2, 0.9, 0.9, 1.0, 1.4,
  1.8, 2.1, 2.0, 1.6, 1.0, 0.5,
];
/** Weekends: later mornings, a long daytime plateau. */
const WEEKEND_TRAFFIC = [
  0.35, 0.2, 0.1, 0.08, 0.08, 0.15, 0.4, 0.9, 1.5, 1.9, 1.8, 1.5, 1.3, 1.2, 1.2, 1.2, 1.3, 1.4, 1.6,
  1.8, 1.8, 1.5, 1.0, 0.6,
];
const WEEKDAY_CUM = hourCdf(WEEKDAY_TRAFFIC);
const WEEKEND_CUM = hourCdf(WEEKEND_TRAFFIC);
/** The chance an impression shows the author's favourite type rather than the season's mix. */
const FAVOURITE_SHARE = 0.45;
/** The chance the post comes from the viewer's own site. */
const HOME_SITE_SHARE = 0.45;
/** Uniforms this stage takes per row. */
export const CONTEXT_UNITS = 10;

/**
 * Kernel, stage 1 of a row: when it happens and who meets what. Fills
 * timestamp, hour_of_day, is_weekend, viewer_id, device, garden_site,
 * author_id and post_type for chunk rows [from, to), whose global index is
 * chunkFirstRow + i, from CONTEXT_UNITS uniforms a row
 * (units[(i - from) * CONTEXT_UNITS + m]).
 * Timestamps rise within a day: row k of the day's n rows takes the jittered
 * quantile (k + u) / n of that day's hourly traffic curve, so the rows come out
 * in time order without sorting.
 *
 * @example
 * fillPlotlineContext(population, units, columns, 0, 1024, 0);
 */
export function fillPlotlineContext(
  pop: PlotlinePopulation,
  units: Float64Array,
  cols: PlotlineChunkColumns,
  from: number,
  to: number,
  chunkFirstRow: number,
): void {
  const { dayFirstRow, dayStart, dayWeekend, daySeason, dayTourShare, siteCount } = pop;
  const { viewerDraw, viewerTraits, siteAuthors, siteAuthorDraw } = pop;
  const authorFavourite = pop.authorFavourite;
  const { timestamp, hour_of_day, is_weekend, viewer_id, device, garden_site } = cols;
  const { author_id, post_type } = cols;
  let day = 0;
  while (dayFirstRow[day + 1] <= chunkFirstRow + from) day++;
  for (let i = from; i < to; i++) {
    const m = (i - from) * CONTEXT_UNITS;
    const row = chunkFirstRow + i;
    while (dayFirstRow[day + 1] <= row) day++;
    const first = dayFirstRow[day];
    const u = (row - first + units[m]) / (dayFirstRow[day + 1] - first);
    const cum = dayWeekend[day] === 1 ? WEEKEND_CUM : WEEKDAY_CUM;
    let hour = 0;
    while (hour < 23 && cum[hour + 1] <= u) hour++;
    const within = (u - cum[hour]) / (cum[hour + 1] - cum[hour]);
    const second = Math.min(86399, Math.floor((hour + within) * 3600));
    timestamp[i] = dayStart[day] + second;
    hour_of_day[i] = Math.floor(second / 3600);
    is_weekend[i] = dayWeekend[day];

    const v = viewerDraw.draw(0, units[m + 1]);
    viewer_id[i] = v;
    const t = v * VIEWER_STRIDE;
    const own = viewerTraits[t + VIEWER_DEVICE];
    device[i] = units[m + 2] < 0.9 ? own : (own + 1 + Math.floor(2 * units[m + 3])) % 3;
    const site =
      units[m + 4] < HOME_SITE_SHARE
        ? viewerTraits[t + VIEWER_HOME]
        : Math.floor(siteCount * units[m + 5]);
    garden_site[i] = site;
    const a = siteAuthors[siteAuthorDraw.draw(site, units[m + 6])];
    author_id[i] = a;

    if (units[m + 7] < dayTourShare[day]) {
      post_type[i] = PLOT_TOUR;
    } else if (units[m + 8] < FAVOURITE_SHARE) {
      post_type[i] = authorFavourite[a];
    } else {
      post_type[i] = seasonalType(daySeason[day], units[m + 9]);
    }
  }
}

/**
 * The season's post-type mix (harvest photos rise, questions and tips fall as
 * the harvest season s goes from 0 to 1); shares always sum to 1.
 */
function seasonalType(s: number, u: number): number {
  let c = 0.15 + 0.25 * s; // harvest_photo
  if (u < c) return 0;
  c += 0.3 - 0.15 * s; // question
  if (u < c) return 1;
  c += 0.15 + 0.05 * s; // swap_offer
  if (u < c) return 2;
  c += 0.15; // event_notice
  if (u < c) return 3;
  return 4; // tip
}

function hourCdf(traffic: readonly number[]): Float64Array {
  const total = traffic.reduce((a, b) => a + b, 0);
  const cum = new Float64Array(25);
  for (let h = 0; h < 24; h++) cum[h + 1] = cum[h] + traffic[h] / total;
  cum[24] = 1;
  return cum;
}
