import type { PlotlineChunkColumns } from "./plotline-columns.js";
import {
  VIEWER_HOME,
  VIEWER_HOME_KM,
  VIEWER_LOCATES,
  VIEWER_POSTING,
  VIEWER_POSTING_EXP,
  VIEWER_SESSIONS,
  VIEWER_STRIDE,
  VIEWER_TENURE,
  type PlotlinePopulation,
} from "./plotline-population.js";
import { PAIR_HASH_RANGE, pairHash } from "./pair-hash.js";
import { EVENT_NOTICE, HARVEST_PHOTO, PLOT_TOUR, SWAP_OFFER } from "./plotline-vocabulary.js";
import { poissonDraw } from "./poisson-draw.js";

/** Median text length per post type (log scale), in POST_TYPES order. */
const TEXT_LOG_MEDIAN = [80, 250, 150, 300, 600, 60].map(Math.log);
/** Replies and reactions a post gathers per log-hour of age, per type, at 100 followers. */
const REPLY_PACE = [0.4, 1.6, 0.9, 0.5, 0.7, 0.5];
const REACTION_PACE = [4.0, 1.2, 1.0, 1.8, 2.2, 3.0];
const SALT_NEIGHBOUR = 0x51ed270b;
const SALT_FOLLOW = 0x2545f491;
const SALT_UNSCORED = 0x68e31da4;
/** exp(base) of the past-interaction means, [neighbour * 2 + follows]. */
const PAST_REACTIONS = Float64Array.from([0, 1.3, 1.6, 2.9], (x) => Math.exp(-1.3 + x));
const PAST_REPLIES = Float64Array.from([0, 0.9, 1.5, 2.4], (x) => Math.exp(-2.4 + x));
/** log(1 + k) for small counts, to spare a log per row. */
const LOG1P = Float64Array.from({ length: 64 }, (_, k) => Math.log1p(k));
const NEIGHBOUR_CUT = 0.22 * PAIR_HASH_RANGE;
const UNSCORED_CUT = 0.3 * PAIR_HASH_RANGE;
const TWO_PI = 2 * Math.PI;
const LOG_VIDEO_MEDIAN = Math.log(50);
/** Uniforms this stage takes per row (see the kernel for their use). */
export const FEATURE_UNITS = 18;

/**
 * Kernel, stage 2 of a row: the numeric features of chunk rows [from, to),
 * from the stage-1 columns, the population and FEATURE_UNITS uniforms a row
 * (units[(i - from) * FEATURE_UNITS + m]). Every continuous value is
 * rounded here to the decimals the files keep, so that what a model reads is
 * exactly what the probabilities were computed from. Missing values are NaN:
 * tie_strength for viewers of under 14 days and for some pairs without any
 * history (the app has not scored the tie yet),
 * distance_to_site_km for viewers who share no location, video_seconds for
 * every post that is not a plot tour.
 *
 * @example
 * fillPlotlineFeatures(population, startSeconds, units, columns, 0, 1024);
 */
export function fillPlotlineFeatures(
  pop: PlotlinePopulation,
  startSeconds: number,
  units: Float64Array,
  cols: PlotlineChunkColumns,
  from: number,
  to: number,
): void {
  const { siteCount, siteKm, siteTemperature, authorFollowers, authorPostRate } = pop;
  const traits = pop.viewerTraits;
  const { authorReplyReach, authorReactionReach } = pop;
  const { timestamp, viewer_id, author_id, post_type, garden_site } = cols;
  const { tie_strength, past_reactions_to_author, past_replies_to_author } = cols;
  const { is_plot_neighbour, follows_author, author_followers, author_post_rate } = cols;
  const { post_age_hours, feed_position, text_length, photo_count, video_seconds } = cols;
  const { viewer_tenure_days, recent_sessions, viewer_posts_30d } = cols;
  const { replies_so_far, reactions_so_far, distance_to_site_km, temperature_c } = cols;
  for (let i = from; i < to; i++) {
    const m = (i - from) * FEATURE_UNITS;
    const v = viewer_id[i];
    const a = author_id[i];
    const type = post_type[i];
    const site = garden_site[i];
    const day = Math.floor((timestamp[i] - startSeconds) / 86400);
    const t = v * VIEWER_STRIDE;
    const home = traits[t + VIEWER_HOME];
    const sameSite = home === site;

    // Ties hold for a viewer-author pair on every row, hence a pair hash, not a draw.
    const neighbour = sameSite && pairHash(v, a, SALT_NEIGHBOUR) < NEIGHBOUR_CUT ? 1 : 0;
    const followers = Math.round(authorFollowers[a] * (1 + 0.003 * day));
    const followChance =
      neighbour === 1 ? 0.6 : (sameSite ? 0.12 : 0.05) + (followers > 1000 ? 0.1 : 0);
    const follows = pairHash(v, a, SALT_FOLLOW) < followChance * PAIR_HASH_RANGE ? 1 : 0;
    const tenure = traits[t + VIEWER_TENURE] + day;
    // Longer-standing members have more history: (1 + tenure / 30)^0.25.
    const seniority = Math.sqrt(Math.sqrt(1 + tenure / 30));
    const pair = neighbour * 2 + follows;
    const reactions = poissonDraw(PAST_REACTIONS[pair] * seniority, NaN, units[m], 0);
    const replies = poissonDraw(PAST_REPLIES[pair] * seniority, NaN, units[m + 1], 0);
    // Box-Muller: two normals from units m + 2 and m + 3.
    const radius = Math.sqrt(-2 * Math.log(1 - units[m + 2]));
    const tieNoise = radius * Math.cos(TWO_PI * units[m + 3]);
    const textNoise = radius * Math.sin(TWO_PI * units[m + 3]);
    is_plot_neighbour[i] = neighbour;
    follows_author[i] = follows;
    past_reactions_to_author[i] = reactions;
    past_replies_to_author[i] = replies;
    viewer_tenure_days[i] = tenure;
    // The app scores a tie only after two weeks, and some pairs without history not yet.
    const unscored =
      tenure < 14 ||
      (reactions === 0 &&
        replies === 0 &&
        follows === 0 &&
        neighbour === 0 &&
        pairHash(v, a, SALT_UNSCORED) < UNSCORED_CUT);
    if (unscored) {
      tie_strength[i] = NaN;
    } else {
      const z =
        -2.4 +
        1.5 * neighbour +
        1.1 * follows +
        0.45 * (reactions < 64 ? LOG1P[reactions] : Math.log1p(reactions)) +
        0.6 * (replies < 64 ? LOG1P[replies] : Math.log1p(replies)) +
        0.35 * tieNoise;
      tie_strength[i] = Math.round(1000 / (1 + Math.exp(-z))) / 1000;
    }
    author_followers[i] = followers;
    author_post_rate[i] = authorPostRate[a];

    const age = Math.min(96, -Math.log(1 - units[m + 6]) * (type === EVENT_NOTICE ? 16 : 7));
    const ageHours = Math.round(age * 100) / 100;
    post_age_hours[i] = ageHours;
    feed_position[i] = Math.min(60, 1 + Math.floor(-Math.log(1 - units[m + 7]) * 9));
    const textLength = Math.exp(TEXT_LOG_MEDIAN[type] + 0.55 * textNoise);
    text_length[i] = Math.round(Math.min(5000, Math.max(5, textLength)));
    photo_count[i] = photoCount(type, units[m + 8], units[m + 9]);
    if (type === PLOT_TOUR) {
      const z = Math.sqrt(-2 * Math.log(1 - units[m + 4])) * Math.cos(TWO_PI * units[m + 5]);
      const seconds = Math.exp(LOG_VIDEO_MEDIAN + 0.6 * z);
      video_seconds[i] = Math.round(Math.min(300, Math.max(8, seconds)));
    } else {
      video_seconds[i] = NaN;
    }
    recent_sessions[i] = poissonDraw(
      traits[t + VIEWER_SESSIONS],
      NaN,
      units[m + 10],
      units[m + 11],
    );
    viewer_posts_30d[i] = poissonDraw(
      traits[t + VIEWER_POSTING],
      traits[t + VIEWER_POSTING_EXP],
      units[m + 12],
      units[m + 13],
    );
    const ageFactor = Math.log1p(ageHours);
    const replyMean = REPLY_PACE[type] * ageFactor * authorReplyReach[a];
    replies_so_far[i] = poissonDraw(replyMean, NaN, units[m + 14], units[m + 15]);
    const reactionMean = REACTION_PACE[type] * ageFactor * authorReactionReach[a];
    reactions_so_far[i] = poissonDraw(reactionMean, NaN, units[m + 16], units[m + 17]);
    if (traits[t + VIEWER_LOCATES] === 1) {
      const homeKm = traits[t + VIEWER_HOME_KM];
      const km = sameSite ? homeKm : siteKm[home * siteCount + site] + 0.5 * homeKm;
      distance_to_site_km[i] = Math.round(km * 10) / 10;
    } else {
      distance_to_site_km[i] = NaN;
    }
    temperature_c[i] = siteTemperature[day * siteCount + site];
  }
}

const EXP_NEG_1_5 = Math.exp(-1.5);
const EXP_NEG_0_5 = Math.exp(-0.5);

/** Photos per post: harvest photos carry 1 to 10, swap offers often one or two, others now and then one. */
function photoCount(type: number, u: number, v: number): number {
  if (type === HARVEST_PHOTO) return Math.min(10, 1 + poissonDraw(1.5, EXP_NEG_1_5, u, 0));
  if (type === PLOT_TOUR) return 0;
  if (type === SWAP_OFFER) return u < 0.7 ? 1 + poissonDraw(0.5, EXP_NEG_0_5, v, 0) : 0;
  return u < 0.35 ? 1 : 0;
}
