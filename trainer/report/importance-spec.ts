import type { TopLevelSpec } from "vega-lite";
import type { ForestImportance } from "./report-input.js";

/**
 * Most features drawn per forest; the rest are counted in the caption.
 *
 * @example
 * const shown = Math.min(usedFeatures, IMPORTANCE_TOP);
 */
export const IMPORTANCE_TOP = 30;

/**
 * Feature importance bars of one forest: total gain, cover and split count side by
 * side, features ordered by gain (ties by cover, splits, then name, so the order is
 * stable). Only features some tree splits on are drawn, at most IMPORTANCE_TOP; null when
 * no tree splits at all.
 *
 * @example
 * const spec = importanceSpec({ forest: "reply", features: featureImportance(trees, binned) });
 */
export function importanceSpec(forest: ForestImportance): TopLevelSpec | null {
  const used = forest.features
    .filter((f) => f.splits > 0)
    .sort(
      (a, b) =>
        b.gain - a.gain ||
        b.cover - a.cover ||
        b.splits - a.splits ||
        (a.feature < b.feature ? -1 : a.feature > b.feature ? 1 : 0),
    )
    .slice(0, IMPORTANCE_TOP);
  if (used.length === 0) return null;
  const order = used.map((f) => f.feature);
  const values = used.map((f) => ({
    feature: f.feature,
    gain: f.gain,
    cover: f.cover,
    splits: f.splits,
  }));
  const height = { step: 16 };
  const bar = (
    field: "gain" | "cover" | "splits",
    title: string,
    colour: string,
    first: boolean,
  ) => ({
    width: 190,
    height,
    mark: { type: "bar" as const, color: colour },
    encoding: {
      y: {
        field: "feature",
        type: "nominal" as const,
        sort: order,
        title: null,
        axis: first ? { labelLimit: 180 } : { labels: false, ticks: false },
      },
      x: {
        field,
        type: "quantitative" as const,
        title,
        axis: { format: field === "splits" ? ",d" : ".2~s", tickCount: 4 },
      },
    },
  });
  return {
    title: { text: forest.forest, subtitle: "importance by total gain, cover and split count" },
    data: { values },
    hconcat: [
      bar("gain", "gain", "#0072b2", true),
      bar("cover", "cover", "#56b4e9", false),
      bar("splits", "splits", "#009e73", false),
    ],
    spacing: 8,
  };
}
