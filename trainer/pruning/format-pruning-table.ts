import type { PruneFeaturesResult } from "./prune-features.js";

/**
 * The pruning loop as a small text table: features kept, held-out NE per outcome
 * (5 decimals) and the features each step dropped; a step whose NE passed the
 * tolerance is marked "not kept". Ends with lines naming what was dropped and
 * the features no tree of the first fit (every feature) split on.
 *
 * @example
 * process.stdout.write(formatPruningTable(result));
 * // features kept  NE open  dropped
 * //             8  0.94356
 * //             7  0.94300  noise_c
 */
export function formatPruningTable(result: PruneFeaturesResult): string {
  const header = ["features kept", ...result.outcomes.map((o) => `NE ${o}`), "dropped"];
  const rows = result.steps.map((step) => [
    String(step.featuresKept),
    ...result.outcomes.map((o) => (step.heldOutNe[o] ?? NaN).toFixed(5)),
    step.dropped.join(", ") + (step.accepted ? "" : "  (not kept: NE worse than the tolerance)"),
  ]);
  const widths = header.map((h, c) => Math.max(h.length, ...rows.map((r) => r[c].length)));
  const last = header.length - 1;
  const line = (cells: readonly string[]): string =>
    cells
      .map((cell, c) => (c === last ? cell : cell.padStart(widths[c])))
      .join("  ")
      .trimEnd();
  const dropped =
    result.dropped.length === 0 ? "nothing dropped" : `dropped: ${result.dropped.join(", ")}`;
  const why: Record<PruneFeaturesResult["stopReason"], string> = {
    min_features: "reached the minimum feature count",
    ne_tolerance: "the next drop made held-out NE worse than the tolerance",
    no_candidates: "no droppable feature left",
  };
  const unused = result.steps[0]?.importance.unused ?? [];
  return (
    [line(header), ...rows.map(line)].join("\n") +
    `\nkept ${result.kept.length} features (${why[result.stopReason]}); ${dropped}\n` +
    (unused.length === 0 ? "" : `no tree used (with every feature): ${unused.join(", ")}\n`)
  );
}
