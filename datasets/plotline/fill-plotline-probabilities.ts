import type { PlotlineChunkColumns } from "./plotline-columns.js";
import type { PlotlinePopulation } from "./plotline-population.js";
import {
  EVENT_NOTICE,
  HARVEST_PHOTO,
  PLOT_TOUR,
  QUESTION,
  SWAP_OFFER,
  TIP,
  WEB,
} from "./plotline-vocabulary.js";

/** Logit intercepts, tuned so the first three weeks run near open 20 %, react 6 %, reply 1.5 %, save 2.5 %, reshare 0.4 %, hide 0.3 %. */
const INTERCEPT = [-0.855, -2.26, -5.455, -4.44, -6.142, -6.428];
/** Post-type effects [outcome][type], types in POST_TYPES order. */
const TYPE_EFFECT = [
  [0.2, 0.1, -0.1, -0.2, 0.0, 0.3],
  [0.5, -0.4, -0.5, -0.3, 0.0, 0.4],
  [-0.6, 0.9, 0.4, -0.4, -0.3, -0.5],
  [-0.8, -0.3, 0.1, 0.3, 0.6, -0.2],
  [-0.2, -0.6, 0.5, 0.8, 0.2, 0.3],
  [-0.4, 0.0, 0.3, 0.0, -0.2, 0.1],
];
/** How much tie strength matters, per post type: a lot for harvest photos and questions, little for notices. */
const TIE_OPEN = Float64Array.of(2.2, 2.0, 0.4, 0.4, 0.6, 1.0);
const TIE_REACT = Float64Array.of(3.5, 1.0, 0.4, 0.3, 1.0, 0);
const TIE_REPLY = Float64Array.of(0.8, 3.5, 1.0, 0.3, 0.5, 0.5);
/** How fast interest decays with post age, per post type: event notices keep, harvest photos fade. */
const DECAY_OPEN = Float64Array.of(1.1, 0.6, 0.4, 0.1, 0.3, 0.8);
const DECAY_REACT = Float64Array.of(1.2, 0.5, 0.3, 0.1, 0.4, 0.8);
/** Hour-of-day effects: opening peaks at the morning check, conversation in the evening. */
const HOUR_OPEN = Float64Array.from([
  -0.8, -0.9, -0.9, -0.9, -0.8, -0.3, 0.45, 0.6, 0.5, 0.15, 0, 0, 0.2, 0.2, 0, -0.1, 0, 0.05, 0.2,
  0.35, 0.35, 0.2, -0.15, -0.45,
]);
const HOUR_TALK = Float64Array.from([
  -0.9, -1.0, -1.0, -1.0, -0.9, -0.6, -0.15, 0.15, 0.15, 0, 0, 0, 0.05, 0.05, -0.1, -0.1, 0, 0.2,
  0.5, 0.7, 0.7, 0.5, 0.05, -0.45,
]);
/** log(k) and log(1 + k) for small whole k, to spare logs per row. */
const LOG = Float64Array.from({ length: 64 }, (_, k) => Math.log(k));
const LOG1P = Float64Array.from({ length: 64 }, (_, k) => Math.log1p(k));
const LOG_TOUR_SWEET_SPOT = Math.log(35);
const LOG_TIP_SWEET_SPOT = Math.log(650);
/** On the 1e-9 grid, like every stored probability. */
const P_MIN = 1 / 1e9;
const P_MAX = 999_999_999 / 1e9;

/**
 * Kernel, stage 3 of a row: the true probability of each outcome. It reads
 * nothing but the row's observed columns (features, author_id, timestamp for
 * the season and the layout), the per-author effects and the run's fixed
 * settings, so a model that sees the same columns can reach it exactly. The
 * logits mix shared drivers (tie strength, post age, feed position) with
 * interactions and thresholds (tie x type, photos for harvest photos only,
 * distance for swap offers, text length for tips, video length for plot tours).
 * Each probability is rounded to 1e-9 (and kept within [1e-9, 1 - 1e-9]) before
 * it is stored or used to draw a label, so every file format holds it exactly.
 *
 * @example
 * fillPlotlineProbabilities(population, options, columns, 0, 1024);
 */
export function fillPlotlineProbabilities(
  pop: PlotlinePopulation,
  settings: {
    readonly startSeconds: number;
    readonly layoutChangeIndex: number;
    readonly layoutShift: Float64Array;
  },
  cols: PlotlineChunkColumns,
  from: number,
  to: number,
): void {
  const { authorQuality: q, daySeason } = pop;
  const { startSeconds, layoutChangeIndex, layoutShift } = settings;
  const { timestamp, author_id, post_type, device, tie_strength, past_replies_to_author } = cols;
  const { is_plot_neighbour, follows_author, author_followers, post_age_hours } = cols;
  const { feed_position, text_length, photo_count, video_seconds, hour_of_day } = cols;
  const { is_weekend, viewer_tenure_days, recent_sessions, viewer_posts_30d } = cols;
  const { replies_so_far, reactions_so_far, distance_to_site_km, temperature_c } = cols;
  const out = [
    cols.true_open,
    cols.true_react,
    cols.true_reply,
    cols.true_save,
    cols.true_reshare,
    cols.true_hide,
  ];
  const logit = new Float64Array(6);
  for (let i = from; i < to; i++) {
    const day = Math.floor((timestamp[i] - startSeconds) / 86400);
    const s = daySeason[day];
    const type = post_type[i];
    const qa = author_id[i] * 6;
    const hour = hour_of_day[i];
    const tie = tie_strength[i];
    const hasTie = tie === tie;
    const tie0 = hasTie ? tie : 0;
    // Centred so a missing tie sits a little below an average one.
    const tieLevel = hasTie ? tie - 0.35 : -0.15;
    const ageTerm = -Math.log1p(post_age_hours[i] / 3);
    const positionEffect = -0.5 * LOG[feed_position[i]];
    const follows = follows_author[i];
    const neighbour = is_plot_neighbour[i];
    const dist = distance_to_site_km[i];
    const hasDist = dist === dist;
    const video = video_seconds[i];
    const web = device[i] === WEB;
    const hot = temperature_c[i] >= 25 && hour >= 11 && hour <= 16;
    const newcomer = viewer_tenure_days[i] < 14;
    const reactions = reactions_so_far[i];

    let open =
      TIE_OPEN[type] * tieLevel +
      DECAY_OPEN[type] * ageTerm +
      positionEffect +
      HOUR_OPEN[hour] +
      0.3 * log1pSmall(recent_sessions[i]);
    let react =
      TIE_REACT[type] * tieLevel +
      DECAY_REACT[type] * ageTerm +
      0.7 * positionEffect +
      HOUR_TALK[hour];
    let reply =
      TIE_REPLY[type] * tieLevel +
      0.8 * HOUR_TALK[hour] +
      0.4 * ageTerm +
      0.4 * log1pSmall(past_replies_to_author[i]);
    let save = 0.6 * tieLevel + 0.3 * ageTerm;
    let reshare = 1.0 * tieLevel + 0.3 * follows + 0.4 * HOUR_TALK[hour];
    let hide = -1.0 * tieLevel + (follows === 0 && neighbour === 0 ? 0.5 : -0.3);

    if (author_followers[i] >= 800 && follows === 0) open += 0.3;
    if (hot) {
      open -= 0.7;
      react -= 0.4;
    }
    if (web) {
      open -= 0.15;
      react -= 0.3;
    } else {
      react += 0.1;
    }
    react += 0.5 * follows + (reactions >= 10 ? 0.6 : 0);
    reply += (newcomer ? -0.6 : 0) + (viewer_posts_30d[i] >= 1 ? 0.6 : 0);
    reshare += reactions >= 20 ? 1.0 : 0;
    hide += (newcomer ? 0.5 : 0) + (feed_position[i] > 20 ? 0.4 : 0);

    if (type === HARVEST_PHOTO) {
      // Photos matter for harvest photos only, up to about four.
      const photos = Math.min(4, photo_count[i]);
      open += 0.3 * photos - 0.4 + 0.6 * s;
      react += 0.6 * photos - 1.0 + 0.8 * s;
    } else if (type === QUESTION) {
      open -= 0.6 * s;
      reply += 0.8 * neighbour + (replies_so_far[i] < 3 ? 0.8 : -0.5) + 0.5 * (1 - 2 * s);
      if (text_length[i] > 800) hide += 0.8;
    } else if (type === SWAP_OFFER) {
      reply += hasDist ? (dist < 3 ? 1.4 : dist > 15 ? -1.0 : 0) : -0.2;
      if (hasDist && dist > 20) hide += 0.9;
    } else if (type === EVENT_NOTICE) {
      save += (hasDist ? (dist < 5 ? 1.1 : -0.5) : 0) + (is_weekend[i] === 1 ? -0.6 : 0.3);
      if (hasDist && dist < 5) reshare += 0.8;
    } else if (type === TIP) {
      const x = (Math.log(text_length[i]) - LOG_TIP_SWEET_SPOT) / 0.45;
      save += 1.6 * Math.exp(-x * x) + 0.4 * (1 - s) + (web ? 0.6 : 0);
    } else if (type === PLOT_TOUR) {
      // Short tours get opened, tours shared by close ties get reactions, long ones get saved.
      const x = (Math.log(video) - LOG_TOUR_SWEET_SPOT) / 0.45;
      open += 1.5 * Math.exp(-x * x) - 0.6;
      react += video <= 60 ? 3.0 * tie0 - 0.3 : -0.6;
      save += video > 120 ? 1.2 : -0.4;
      if (video > 150) hide += 0.9;
    }

    logit[0] = open;
    logit[1] = react;
    logit[2] = reply;
    logit[3] = save;
    logit[4] = reshare;
    logit[5] = hide;
    const shifted = day >= layoutChangeIndex;
    for (let k = 0; k < 6; k++) {
      const z =
        INTERCEPT[k] + TYPE_EFFECT[k][type] + q[qa + k] + logit[k] + (shifted ? layoutShift[k] : 0);
      const p = Math.round(1e9 / (1 + Math.exp(-z))) / 1e9;
      out[k][i] = p < P_MIN ? P_MIN : p > P_MAX ? P_MAX : p;
    }
  }
}

function log1pSmall(k: number): number {
  return k < 64 ? LOG1P[k] : Math.log1p(k);
}
