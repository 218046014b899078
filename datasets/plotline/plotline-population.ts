import { AliasTable } from "./alias-table.js";
import type { ResolvedPlotlineOptions } from "./plotline-options.js";
import { RandomSource } from "./random-source.js";
import { GARDEN_SITES } from "./plotline-vocabulary.js";

/**
 * The fixed cast and calendar of a Plotline run, drawn once from the seed:
 * viewers, authors, sites and days, all as typed arrays indexed by id code.
 * Viewer traits (activity, tenure, habits) only shape the observed features;
 * author quality enters the outcome logits, which is fair because author_id
 * is an observed feature.
 */
export interface PlotlinePopulation {
  readonly siteCount: number;
  /** Distance between site centres, km, [site * siteCount + site]. */
  readonly siteKm: Float64Array;
  /** Draws the viewer of an impression in proportion to activity. */
  readonly viewerDraw: AliasTable;
  /**
   * Everything the context and feature stages read about a viewer, 8 floats a
   * viewer (half a cache line, so one miss a row at most instead of seven, in
   * 1.6 MB for 50,000 viewers): fields at the VIEWER_* offsets. Single
   * precision is plenty for them.
   */
  readonly viewerTraits: Float32Array;
  readonly authorSite: Int32Array;
  readonly authorFollowers: Float64Array;
  /** (followers / 100)^0.3 and ^0.5 on the first day: how fast a post gathers replies and reactions. */
  readonly authorReplyReach: Float64Array;
  readonly authorReactionReach: Float64Array;
  /** Posts per week, 2 decimals. */
  readonly authorPostRate: Float64Array;
  /** The post type an author favours (never the new type). */
  readonly authorFavourite: Int32Array;
  /** Per-author logit effect for each outcome, [author * 6 + outcome]. */
  readonly authorQuality: Float64Array;
  /** Authors grouped by site, in site order. */
  readonly siteAuthors: Int32Array;
  /** Draws a position in siteAuthors within a site's segment, in proportion to popularity. */
  readonly siteAuthorDraw: AliasTable;
  /** First global row of each day; dayFirstRow[days] = rows. */
  readonly dayFirstRow: Float64Array;
  readonly dayStart: Float64Array;
  /** Harvest-season progress of each day, 0..1 (see DEVELOPERS.md, "The Plotline scenario"). */
  readonly daySeason: Float64Array;
  readonly dayWeekend: Uint8Array;
  /** Share of impressions that are plot tours, 0 before the new type's day. */
  readonly dayTourShare: Float64Array;
  /** Daily mean temperature per site, deg C, 1 decimal, [day * siteCount + site]. */
  readonly siteTemperature: Float64Array;
}

/** Home site; tenure on the first day; 1 when the viewer shares a location (else distance is missing). */
export const VIEWER_HOME = 0;
export const VIEWER_TENURE = 1;
export const VIEWER_LOCATES = 2;
/** Distance from home to the home site, km. */
export const VIEWER_HOME_KM = 3;
/** Mean app sessions per 7 days. */
export const VIEWER_SESSIONS = 4;
/** The device the viewer mostly uses (a DEVICES code). */
export const VIEWER_DEVICE = 5;
/** Mean own posts per 30 days, and exp(-mean). */
export const VIEWER_POSTING = 6;
export const VIEWER_POSTING_EXP = 7;
export const VIEWER_STRIDE = 8;

/** Author effect loadings on the shared quality g and each outcome's own noise. */
const QUALITY_SHARED = [0.35, 0.45, 0.3, 0.35, 0.4, -0.45];
const QUALITY_OWN = [0.2, 0.2, 0.3, 0.25, 0.3, 0.3];
const FAVOURITE_CUM = [0.25, 0.45, 0.6, 0.75, 1];
const DEVICE_CUM = [0.45, 0.85, 1];
const DAY_SECONDS = 86400;

/**
 * Draws the population of a run from its seed (stream 0).
 *
 * @example
 * const population = buildPlotlinePopulation(resolvePlotlineOptions({ seed: 7 }));
 */
export function buildPlotlinePopulation(options: ResolvedPlotlineOptions): PlotlinePopulation {
  const rng = new RandomSource(options.seed, 0);
  const siteCount = GARDEN_SITES.length;
  const siteX = Float64Array.from({ length: siteCount }, () => 30 * rng.unit());
  const siteY = Float64Array.from({ length: siteCount }, () => 30 * rng.unit());
  const siteKm = new Float64Array(siteCount * siteCount);
  for (let a = 0; a < siteCount; a++) {
    for (let b = 0; b < siteCount; b++) {
      siteKm[a * siteCount + b] = Math.hypot(siteX[a] - siteX[b], siteY[a] - siteY[b]);
    }
  }
  const siteCum = cumulative(Float64Array.from({ length: siteCount }, () => 0.5 + rng.unit()));
  const siteWarmth = Float64Array.from({ length: siteCount }, () => 3 * rng.unit() - 1.5);

  const V = options.viewers;
  // Ids in order of falling activity: the busiest viewers' traits share a few
  // cache lines, which the feature stage reads on most rows.
  const activity = Float64Array.from({ length: V }, () => Math.exp(0.8 * rng.normal()));
  activity.sort().reverse();
  const viewerDraw = new AliasTable(activity);
  const viewerHome = Int32Array.from({ length: V }, () => pick(siteCum, rng.unit()));
  const viewerDevice = Int32Array.from({ length: V }, () => pick(DEVICE_CUM, rng.unit()));
  const viewerTenure = Int32Array.from({ length: V }, () =>
    rng.unit() < 0.1
      ? rng.below(21)
      : Math.round(Math.min(4000, Math.max(21, Math.exp(5 + 1.1 * rng.normal())))),
  );
  const viewerLocates = Uint8Array.from({ length: V }, () => (rng.unit() < 0.85 ? 1 : 0));
  const viewerHomeKm = Float64Array.from({ length: V }, () => 0.2 + 2.3 * rng.unit());
  const viewerSessions = Float64Array.from({ length: V }, () => Math.exp(1.7 + 0.6 * rng.normal()));
  const viewerPosting = Float64Array.from({ length: V }, () => Math.exp(-0.8 + 1.1 * rng.normal()));
  const viewerTraits = new Float32Array(V * VIEWER_STRIDE);
  for (let v = 0; v < V; v++) {
    const t = v * VIEWER_STRIDE;
    viewerTraits[t + VIEWER_HOME] = viewerHome[v];
    viewerTraits[t + VIEWER_TENURE] = viewerTenure[v];
    viewerTraits[t + VIEWER_LOCATES] = viewerLocates[v];
    viewerTraits[t + VIEWER_HOME_KM] = viewerHomeKm[v];
    viewerTraits[t + VIEWER_SESSIONS] = viewerSessions[v];
    viewerTraits[t + VIEWER_DEVICE] = viewerDevice[v];
    viewerTraits[t + VIEWER_POSTING] = viewerPosting[v];
    viewerTraits[t + VIEWER_POSTING_EXP] = Math.exp(-viewerPosting[v]);
  }

  const A = options.authors;
  const authorSite = Int32Array.from({ length: A }, (_, a) =>
    a < siteCount ? a : pick(siteCum, rng.unit()),
  );
  const shared = Float64Array.from({ length: A }, () => rng.normal());
  const popularity = Float64Array.from(shared, (g) => Math.exp(0.9 * rng.normal() + 0.35 * g));
  const authorFollowers = Float64Array.from(shared, (g) =>
    Math.round(Math.min(200_000, Math.exp(4 + 1.1 * rng.normal() + 0.5 * g))),
  );
  const authorReplyReach = Float64Array.from(authorFollowers, (f) => Math.pow(f / 100, 0.3));
  const authorReactionReach = Float64Array.from(authorFollowers, (f) => Math.sqrt(f / 100));
  const authorPostRate = Float64Array.from(
    { length: A },
    () => Math.round(100 * Math.exp(0.4 + 0.6 * rng.normal())) / 100,
  );
  const authorFavourite = Int32Array.from({ length: A }, () => pick(FAVOURITE_CUM, rng.unit()));
  const authorQuality = new Float64Array(A * 6);
  for (let a = 0; a < A; a++) {
    for (let k = 0; k < 6; k++) {
      authorQuality[a * 6 + k] = QUALITY_SHARED[k] * shared[a] + QUALITY_OWN[k] * rng.normal();
    }
  }
  const siteStart = new Int32Array(siteCount + 1);
  for (let a = 0; a < A; a++) siteStart[authorSite[a] + 1]++;
  for (let s = 0; s < siteCount; s++) siteStart[s + 1] += siteStart[s];
  const fill = siteStart.slice(0, siteCount);
  const siteAuthors = new Int32Array(A);
  for (let a = 0; a < A; a++) siteAuthors[fill[authorSite[a]]++] = a;
  const siteAuthorDraw = new AliasTable(
    Float64Array.from(siteAuthors, (a) => popularity[a]),
    siteStart,
  );

  const D = options.days;
  const dayFirstRow = Float64Array.from({ length: D + 1 }, (_, d) =>
    Math.floor((d * options.rows) / D),
  );
  const dayStart = Float64Array.from(
    { length: D },
    (_, d) => options.startSeconds + d * DAY_SECONDS,
  );
  const daySeason = Float64Array.from(dayStart, harvestSeason);
  const dayWeekend = Uint8Array.from(dayStart, (t) => {
    const weekday = new Date(t * 1000).getUTCDay();
    return weekday === 0 || weekday === 6 ? 1 : 0;
  });
  const dayTourShare = Float64Array.from({ length: D }, (_, d) =>
    d < options.newPostTypeIndex
      ? 0
      : 0.04 + 0.08 * Math.min(1, (d - options.newPostTypeIndex) / 7),
  );
  const siteTemperature = new Float64Array(D * siteCount);
  for (let d = 0; d < D; d++) {
    for (let s = 0; s < siteCount; s++) {
      const t = 15.5 + 9 * daySeason[d] + siteWarmth[s] + 2.8 * rng.normal();
      siteTemperature[d * siteCount + s] = Math.round(10 * t) / 10 + 0;
    }
  }
  return {
    siteCount,
    siteKm,
    viewerDraw,
    viewerTraits,
    authorSite,
    authorFollowers,
    authorReplyReach,
    authorReactionReach,
    authorPostRate,
    authorFavourite,
    authorQuality,
    siteAuthors,
    siteAuthorDraw,
    dayFirstRow,
    dayStart,
    daySeason,
    dayWeekend,
    dayTourShare,
    siteTemperature,
  };
}

/**
 * Harvest-season progress: sin^2 of the day of year, 0 on 1 June, 1 on
 * 1 September, 0 again in early December and through winter and spring.
 */
function harvestSeason(epochSeconds: number): number {
  const date = new Date(epochSeconds * 1000);
  const june1 = Date.UTC(date.getUTCFullYear(), 5, 1) / 1000;
  const x = (epochSeconds - june1) / DAY_SECONDS / 184;
  return x <= 0 || x >= 1 ? 0 : Math.sin(Math.PI * x) ** 2;
}

function cumulative(weights: Float64Array): Float64Array {
  let sum = 0;
  for (let i = 0; i < weights.length; i++) weights[i] = sum += weights[i];
  return weights;
}

/** The first index whose cumulative weight exceeds u * total. */
function pick(cum: ArrayLike<number>, u: number): number {
  const target = u * cum[cum.length - 1];
  let lo = 0;
  let hi = cum.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (cum[mid] > target) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}
