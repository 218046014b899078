import type { TopLevelSpec } from "vega-lite";
import type { StalenessReport } from "./report-input.js";
import { windowAxis } from "./window-axis.js";

/**
 * Forest leaf PSI per window, one line per forest, with the usual reading's reference
 * lines at 0.10 (moderate shift) and 0.25 (significant shift) and the refit threshold
 * when it is neither.
 *
 * @example
 * const spec = forestPsiSpec({ windows: ["w1", "w2"], forests: [{ forest: "reply", perWindow: [psi1, psi2] }] });
 */
export function forestPsiSpec(report: StalenessReport): TopLevelSpec {
  const values: { window: string; forest: string; psi: number }[] = [];
  for (const series of report.forests) {
    series.perWindow.forEach((w, i) => {
      if (Number.isFinite(w.forest))
        values.push({ window: report.windows[i], forest: series.forest, psi: w.forest });
    });
  }
  const threshold = report.threshold ?? 0.25;
  const references = [
    { psi: 0.1, label: "0.10 moderate", colour: "#b8860b" },
    { psi: 0.25, label: "0.25 significant", colour: "#c8423b" },
  ];
  if (threshold !== 0.1 && threshold !== 0.25) {
    references.push({ psi: threshold, label: `refit threshold ${threshold}`, colour: "#6a3d9a" });
  }
  return {
    title: {
      text: "Forest leaf PSI",
      subtitle: "mean over trees, trees' fit window against each window",
    },
    width: 520,
    height: 220,
    layer: [
      {
        data: { values: references },
        layer: [
          { mark: { type: "rule", strokeDash: [5, 4] } },
          {
            mark: { type: "text", align: "left", dx: 4, dy: -6, fontSize: 10 },
            encoding: { text: { field: "label" }, x: { value: 0 } },
          },
        ],
        encoding: {
          y: { field: "psi", type: "quantitative" },
          color: { field: "colour", type: "nominal", scale: null, legend: null },
        },
      },
      {
        data: { values },
        mark: { type: "line", point: { size: 36 } },
        encoding: {
          x: {
            field: "window",
            type: "ordinal",
            title: "window",
            sort: [...report.windows],
            scale: { domain: [...report.windows] },
            axis: windowAxis(report.windows, 520),
          },
          y: { field: "psi", type: "quantitative", title: "leaf PSI" },
          color: {
            field: "forest",
            type: "nominal",
            title: "forest",
            scale: { scheme: "tableau10" },
          },
        },
      },
    ],
    resolve: { scale: { color: "independent" } },
  };
}
