import type { TopLevelSpec } from "vega-lite";
import type { PruningReport } from "./report-input.js";

/**
 * Held-out NE against the number of features kept, one line per outcome; the x axis runs
 * from many features to few, the order the pruning loop takes. Null when no step has a
 * finite NE.
 *
 * @example
 * const spec = pruningSpec({ steps: [{ featuresKept: 12, heldOutNe: { reply: 0.91 }, dropped: [] }] });
 */
export function pruningSpec(report: PruningReport): TopLevelSpec | null {
  const values: { kept: number; outcome: string; ne: number }[] = [];
  for (const step of report.steps) {
    for (const [outcome, ne] of Object.entries(step.heldOutNe)) {
      if (Number.isFinite(ne)) values.push({ kept: step.featuresKept, outcome, ne });
    }
  }
  if (values.length === 0) return null;
  return {
    title: {
      text: "Held-out NE by features kept",
      subtitle: "each step drops the weakest features and refits",
    },
    width: 420,
    height: 220,
    data: { values },
    mark: { type: "line", point: { size: 36 } },
    encoding: {
      x: {
        field: "kept",
        type: "quantitative",
        title: "features kept",
        scale: { reverse: true, zero: false },
        axis: { format: ",d", tickMinStep: 1 },
      },
      y: {
        field: "ne",
        type: "quantitative",
        title: "held-out normalized entropy",
        scale: { zero: false },
      },
      color: {
        field: "outcome",
        type: "nominal",
        title: "outcome",
        scale: { scheme: "tableau10" },
      },
      order: { field: "kept", type: "quantitative", sort: "descending" },
    },
  };
}
