import type { WrittenColumn } from "../../trainer/data/write-columns.js";
import type { ResolvedPlotlineOptions } from "./plotline-options.js";
import {
  DEVICES,
  GARDEN_SITES,
  PLOTLINE_OUTCOMES,
  POST_TYPES,
  authorIds,
  viewerIds,
} from "./plotline-vocabulary.js";

/** One chunk of Plotline rows, column by column (names as in the files). */
export type PlotlineChunkColumns = {
  /** Epoch seconds, whole. */
  readonly timestamp: Float64Array;
  readonly viewer_id: Int32Array;
  readonly author_id: Int32Array;
  readonly post_type: Int32Array;
  readonly garden_site: Int32Array;
  readonly device: Int32Array;
  readonly tie_strength: Float64Array;
  readonly past_reactions_to_author: Int32Array;
  readonly past_replies_to_author: Int32Array;
  readonly is_plot_neighbour: Int32Array;
  readonly follows_author: Int32Array;
  readonly author_followers: Int32Array;
  readonly author_post_rate: Float64Array;
  readonly post_age_hours: Float64Array;
  readonly feed_position: Int32Array;
  readonly text_length: Int32Array;
  readonly photo_count: Int32Array;
  readonly video_seconds: Float64Array;
  readonly hour_of_day: Int32Array;
  readonly is_weekend: Int32Array;
  readonly viewer_tenure_days: Int32Array;
  readonly recent_sessions: Int32Array;
  readonly viewer_posts_30d: Int32Array;
  readonly replies_so_far: Int32Array;
  readonly reactions_so_far: Int32Array;
  readonly distance_to_site_km: Float64Array;
  readonly temperature_c: Float64Array;
  readonly open: Uint8Array;
  readonly react: Uint8Array;
  readonly reply: Uint8Array;
  readonly save: Uint8Array;
  readonly reshare: Uint8Array;
  readonly hide: Uint8Array;
  readonly true_open: Float64Array;
  readonly true_react: Float64Array;
  readonly true_reply: Float64Array;
  readonly true_save: Float64Array;
  readonly true_reshare: Float64Array;
  readonly true_hide: Float64Array;
};

/** Decimals kept for the continuous features (the values are rounded to them when drawn). */
const FLOAT_DECIMALS: Partial<Record<keyof PlotlineChunkColumns, number>> = {
  timestamp: 0,
  tie_strength: 3,
  author_post_rate: 2,
  post_age_hours: 2,
  video_seconds: 0,
  distance_to_site_km: 1,
  temperature_c: 1,
};
/** True probabilities are rounded to 1e-9 before anything uses them. */
export const TRUE_PROBABILITY_DECIMALS = 9;

/**
 * The column declarations of a Plotline file, in file order: timestamp, ids,
 * numeric features, outcomes, true probabilities.
 *
 * @example
 * plotlineColumns(resolvePlotlineOptions()).map((c) => c.name);
 */
export function plotlineColumns(options: ResolvedPlotlineOptions): WrittenColumn[] {
  const categories: Partial<Record<keyof PlotlineChunkColumns, readonly string[]>> = {
    viewer_id: viewerIds(options.viewers),
    author_id: authorIds(options.authors),
    post_type: POST_TYPES,
    garden_site: GARDEN_SITES,
    device: DEVICES,
  };
  return PLOTLINE_COLUMN_NAMES.map((name): WrittenColumn => {
    const list = categories[name];
    if (list !== undefined) return { name, type: "category", categories: list };
    const decimals = FLOAT_DECIMALS[name];
    if (decimals !== undefined) return { name, type: "float64", decimals };
    if (name.startsWith("true_")) {
      return { name, type: "float64", decimals: TRUE_PROBABILITY_DECIMALS };
    }
    if (isOutcome(name)) return { name, type: "label" };
    return { name, type: "int" };
  });
}

/**
 * Fresh zeroed arrays for a chunk of `n` rows.
 *
 * @example
 * const columns = allocatePlotlineColumns(65536);
 */
export function allocatePlotlineColumns(n: number): PlotlineChunkColumns {
  const out: Record<string, Float64Array | Int32Array | Uint8Array> = {};
  for (const name of PLOTLINE_COLUMN_NAMES) {
    out[name] = isFloat(name)
      ? new Float64Array(n)
      : isOutcome(name)
        ? new Uint8Array(n)
        : new Int32Array(n);
  }
  return out as unknown as PlotlineChunkColumns;
}

/** Every column name, in file order. */
export const PLOTLINE_COLUMN_NAMES: readonly (keyof PlotlineChunkColumns)[] = [
  "timestamp",
  "viewer_id",
  "author_id",
  "post_type",
  "garden_site",
  "device",
  "tie_strength",
  "past_reactions_to_author",
  "past_replies_to_author",
  "is_plot_neighbour",
  "follows_author",
  "author_followers",
  "author_post_rate",
  "post_age_hours",
  "feed_position",
  "text_length",
  "photo_count",
  "video_seconds",
  "hour_of_day",
  "is_weekend",
  "viewer_tenure_days",
  "recent_sessions",
  "viewer_posts_30d",
  "replies_so_far",
  "reactions_so_far",
  "distance_to_site_km",
  "temperature_c",
  "open",
  "react",
  "reply",
  "save",
  "reshare",
  "hide",
  "true_open",
  "true_react",
  "true_reply",
  "true_save",
  "true_reshare",
  "true_hide",
];

function isFloat(name: keyof PlotlineChunkColumns): boolean {
  return FLOAT_DECIMALS[name] !== undefined || name.startsWith("true_");
}

function isOutcome(name: string): boolean {
  return (PLOTLINE_OUTCOMES as readonly string[]).includes(name);
}
