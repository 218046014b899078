import type { TopLevelSpec } from "vega-lite";
import { ARM_COLOURS } from "./chart-config.js";
import { FRESHNESS_ARM_LABELS, type FreshnessReport } from "./report-input.js";
import { windowAxis } from "./window-axis.js";

const ARM_ORDER = Object.values(FRESHNESS_ARM_LABELS);
// Four panels a row (two outcomes x NE and calibration) fit a 1,100-pixel window.
const PANEL_WIDTH = 170;

/**
 * The freshness study in one chart: per outcome (in order of first appearance) a panel of
 * NE per window and a panel of calibration per window, one line per arm, two outcomes to
 * a row and one legend for all. Calibration has its reference line at 1; NE has none,
 * because a drift of a few percent would be squashed against it. Null when no figure is
 * finite.
 *
 * @example
 * const spec = freshnessSpec(study);
 */
export function freshnessSpec(study: FreshnessReport): TopLevelSpec | null {
  const outcomes = [...new Set(study.figures.map((f) => f.outcome))];
  const unit = study.windowUnit ?? "window";
  const x = {
    field: "window",
    type: "ordinal" as const,
    title: unit,
    sort: [...study.windows],
    scale: { domain: [...study.windows] },
    axis: windowAxis(study.windows, PANEL_WIDTH),
  };
  const color = {
    field: "arm",
    type: "nominal" as const,
    scale: { domain: ARM_ORDER, range: [...ARM_COLOURS] },
    legend: {
      orient: "top" as const,
      direction: "horizontal" as const,
      title: null,
      labelLimit: 300,
    },
  };
  const panel = (outcome: string, metric: "ne" | "calibration") => {
    const values: { window: string; arm: string; value: number }[] = [];
    for (const f of study.figures) {
      if (f.outcome === outcome && Number.isFinite(f[metric]))
        values.push({
          window: study.windows[f.window],
          arm: FRESHNESS_ARM_LABELS[f.arm],
          value: f[metric],
        });
    }
    const title = metric === "ne" ? "NE" : "calibration";
    return {
      title: `${outcome}: ${title}`,
      width: PANEL_WIDTH,
      height: 130,
      layer: [
        {
          data: { values },
          mark: { type: "line" as const, point: { size: 30 } },
          encoding: {
            x,
            y: {
              field: "value",
              type: "quantitative" as const,
              title,
              scale: { zero: false },
              axis: { tickCount: 5 },
            },
            color,
          },
        },
        ...(metric === "calibration"
          ? [
              {
                data: { values: [{ one: 1 }] },
                mark: { type: "rule" as const, color: "#999", strokeDash: [4, 4] },
                encoding: { y: { field: "one", type: "quantitative" as const } },
              },
            ]
          : []),
      ],
    };
  };
  const panels = outcomes.flatMap((o) => [panel(o, "ne"), panel(o, "calibration")]);
  if (panels.every((p) => p.layer[0].data.values.length === 0)) return null;
  return {
    title: {
      text: "NE and calibration per window",
      subtitle: `calibration is predicted / observed; one point per ${unit}`,
    },
    concat: panels,
    columns: 4,
    spacing: { row: 20, column: 24 },
  };
}
