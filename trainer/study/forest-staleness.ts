import type { EncodedLayout } from "../../scorer/encoded-layout.js";
import type { ForestModel } from "../../scorer/model-types.js";
import { leafPsi } from "../metrics/leaf-psi.js";
import { staleness } from "../metrics/staleness.js";
import type { ForestPsiSeries, StalenessReport } from "../report/report-input.js";

/**
 * Tree staleness over windows: for every forest, the leaf PSI of each tree (the
 * share of rows reaching each leaf in the trees' fit span against each window)
 * and the forest's PSI (the mean over its trees, see leafPsi), with the verdict
 * of staleness() on the latest window at `threshold`. Counts are indexed by
 * encoded leaf (the layout's leaf slots, as Scorer.traverseBatch gives them).
 * Forests without trees have no leaves to compare and are left out.
 *
 * @example
 * const report = forestStaleness(forests, scorer.layout, fitCounts, [week2, week3], ["days 8-14", "days 15-21"], 0.25);
 * report.verdict?.refit; // true when a forest reached 0.25 in days 15-21
 */
export function forestStaleness(
  forests: readonly ForestModel[],
  layout: EncodedLayout,
  fitCounts: Float64Array,
  windowCounts: readonly Float64Array[],
  windowLabels: readonly string[],
  threshold: number,
): StalenessReport {
  const series: ForestPsiSeries[] = [];
  forests.forEach((forest, f) => {
    const leaves = 1 << forest.depth;
    const from = layout.leafOffset[f];
    const to = from + forest.trees.length * leaves;
    if (to === from) return;
    const fit = fitCounts.subarray(from, to);
    series.push({
      forest: forest.outcome,
      perWindow: windowCounts.map((counts) => leafPsi(fit, counts.subarray(from, to), leaves)),
    });
  });
  const last = windowLabels.length - 1;
  const latest: Record<string, number> = Object.create(null) as Record<string, number>;
  for (const s of series) latest[s.forest] = s.perWindow[last].forest;
  const verdict = series.length > 0 && last >= 0 ? staleness(latest, threshold) : undefined;
  return {
    windows: [...windowLabels],
    forests: series,
    threshold,
    verdict:
      verdict === undefined
        ? undefined
        : { refit: verdict.refit, reason: `${windowLabels[last]}: ${verdict.reason}` },
  };
}
