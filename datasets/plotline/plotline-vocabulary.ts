/**
 * The fixed words of the Plotline scenario: outcomes, post types, garden
 * sites and devices, in code order (a category's code is its index here).
 *
 * @example
 * POST_TYPES[PLOT_TOUR]; // "plot_tour"
 */
export const PLOTLINE_OUTCOMES = ["open", "react", "reply", "save", "reshare", "hide"] as const;
export type PlotlineOutcome = (typeof PLOTLINE_OUTCOMES)[number];

/** Post types; plot_tour (last) appears only from the new-type day on. */
export const POST_TYPES = [
  "harvest_photo",
  "question",
  "swap_offer",
  "event_notice",
  "tip",
  "plot_tour",
] as const;
export const HARVEST_PHOTO = 0;
export const QUESTION = 1;
export const SWAP_OFFER = 2;
export const EVENT_NOTICE = 3;
export const TIP = 4;
/** The short video tour that appears on `newPostTypeDay`. */
export const PLOT_TOUR = 5;

/** Twelve invented allotment sites. */
export const GARDEN_SITES = [
  "elm_row",
  "mill_lane",
  "riverside",
  "orchard_hill",
  "station_yard",
  "beacon_fields",
  "willow_bank",
  "quarry_top",
  "canal_side",
  "church_meadow",
  "foxglove_way",
  "brookend",
] as const;

/** The viewer's device. */
export const DEVICES = ["ios", "android", "web"] as const;
export const WEB = 2;

/**
 * Author ids in code order, 5 digits.
 *
 * @example
 * authorIds(2); // ["au00001", "au00002"]
 */
export function authorIds(count: number): string[] {
  return Array.from({ length: count }, (_, i) => `au${String(i + 1).padStart(5, "0")}`);
}

/**
 * Viewer ids in code order, 6 digits.
 *
 * @example
 * viewerIds(1); // ["vw000001"]
 */
export function viewerIds(count: number): string[] {
  return Array.from({ length: count }, (_, i) => `vw${String(i + 1).padStart(6, "0")}`);
}
