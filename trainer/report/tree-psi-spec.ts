import type { TopLevelSpec } from "vega-lite";
import { PSI_COLOURS } from "./chart-config.js";
import type { ForestPsiSeries } from "./report-input.js";
import { windowAxis } from "./window-axis.js";

/**
 * Leaf PSI of every tree of one forest in every window, as cells coloured by the usual
 * reading (below 0.10 stable, 0.10 to 0.25 moderate, above significant), so one tree
 * that drifted stands out even when the forest mean looks calm. The plot keeps a fixed
 * height range, so forests of hundreds of trees still fit on the page.
 *
 * @example
 * const spec = treePsiSpec(["w1", "w2"], { forest: "reply", perWindow: [psi1, psi2] });
 */
export function treePsiSpec(windows: readonly string[], series: ForestPsiSeries): TopLevelSpec {
  const values: { window: string; tree: number; psi: number }[] = [];
  let trees = 0;
  series.perWindow.forEach((w, i) => {
    trees = Math.max(trees, w.perTree.length);
    for (let t = 0; t < w.perTree.length; t++) {
      if (Number.isFinite(w.perTree[t]))
        values.push({ window: windows[i], tree: t, psi: w.perTree[t] });
    }
  });
  const tickEvery = trees <= 20 ? 1 : trees <= 50 ? 5 : trees <= 200 ? 10 : trees <= 500 ? 50 : 100;
  const ticks: number[] = [];
  for (let t = 0; t < trees; t += tickEvery) ticks.push(t);
  const width = Math.min(480, Math.max(160, windows.length * 40));
  return {
    title: { text: series.forest, subtitle: "leaf PSI per tree" },
    width,
    height: Math.min(300, Math.max(80, trees * 8)),
    data: { values },
    // Thousands of cells: a per-cell description would only bloat the file for screen readers.
    mark: { type: "rect", aria: false },
    encoding: {
      x: {
        field: "window",
        type: "ordinal",
        title: "window",
        sort: [...windows],
        scale: { domain: [...windows] },
        axis: windowAxis(windows, width),
      },
      y: {
        field: "tree",
        type: "ordinal",
        title: "tree",
        scale: { domain: Array.from({ length: trees }, (_, t) => t) },
        axis: { values: ticks },
      },
      color: {
        field: "psi",
        type: "quantitative",
        title: "leaf PSI",
        scale: { type: "threshold", domain: [0.1, 0.25], range: [...PSI_COLOURS] },
        legend: { orient: "right" },
      },
    },
  };
}
