import type { TopLevelSpec } from "vega-lite";
import type { ReportReliability } from "./report-input.js";

/**
 * A reliability diagram: per bin the mean prediction against the observed positive rate,
 * point area by rows, with the diagonal a calibrated head would follow. Both axes share
 * one domain zoomed to the data, because engagement rates sit near zero and a full
 * [0, 1] square would crush every point into one corner. Null when no bin has rows.
 *
 * @example
 * const spec = reliabilitySpec("reply", reliabilityBins(predicted, label, 10));
 */
export function reliabilitySpec(outcome: string, bins: ReportReliability): TopLevelSpec | null {
  const values: { predicted: number; observed: number; rows: number }[] = [];
  let top = 0;
  for (let k = 0; k < bins.count.length; k++) {
    const rows = bins.count[k];
    const predicted = bins.meanPredicted[k];
    const observed = bins.observedRate[k];
    if (!(rows > 0) || !Number.isFinite(predicted) || !Number.isFinite(observed)) continue;
    values.push({ predicted, observed, rows });
    top = Math.max(top, predicted, observed);
  }
  if (values.length === 0) return null;
  const domain = [0, niceCeiling(top)];
  const axis = { format: domain[1] < 0.1 ? ".1%" : ".0%", tickCount: 5 };
  return {
    title: outcome,
    width: 200,
    height: 200,
    layer: [
      {
        data: { values: [{ a: 0, b: domain[1] }] },
        mark: { type: "rule", color: "#999", strokeDash: [4, 4] },
        encoding: {
          x: { field: "a", type: "quantitative", scale: { domain } },
          y: { field: "a", type: "quantitative", scale: { domain } },
          x2: { field: "b" },
          y2: { field: "b" },
        },
      },
      {
        data: { values },
        layer: [
          // A line through one point would be an empty path: draw it from two bins on.
          ...(values.length >= 2
            ? [
                {
                  mark: { type: "line" as const, color: "#0072b2", strokeWidth: 1.5, opacity: 0.6 },
                },
              ]
            : []),
          {
            mark: { type: "point", color: "#0072b2", opacity: 0.85 },
            encoding: {
              size: {
                field: "rows",
                type: "quantitative",
                title: "rows",
                scale: { range: [16, 360] },
                legend: { format: ",d", orient: "right", tickCount: 4 },
              },
            },
          },
        ],
        encoding: {
          x: {
            field: "predicted",
            type: "quantitative",
            title: "mean predicted probability",
            scale: { domain, nice: false },
            axis,
          },
          y: {
            field: "observed",
            type: "quantitative",
            title: "observed positive rate",
            scale: { domain, nice: false },
            axis,
          },
          order: { field: "predicted", type: "quantitative" },
        },
      },
    ],
  };
}

/** The smallest of 1, 2 or 5 times a power of ten at or above x (x in (0, 1]), capped at 1. */
function niceCeiling(x: number): number {
  if (!(x > 0)) return 1;
  const target = x * 1.05;
  const power = 10 ** Math.floor(Math.log10(target));
  for (const step of [1, 2, 5, 10]) {
    if (step * power >= target) return Math.min(1, step * power);
  }
  return 1;
}
