import type { ReportInput } from "../report/report-input.js";
import type { PruneFeaturesResult } from "./prune-features.js";

/**
 * The report sections of a pruning run: the importance bars of the fit with
 * every feature (one chart per forest) and the held-out NE against features
 * kept, with run facts and a one-line finding.
 *
 * @example
 * await writeReport("runs/may/pruning.html", pruningReportInput(result, { data: "plots.parquet", schemaPath: "pruned.json" }));
 */
export function pruningReportInput(
  result: PruneFeaturesResult,
  context: { readonly data?: string; readonly schemaPath?: string; readonly title?: string } = {},
): ReportInput {
  const first = result.steps[0];
  const held = result.heldOutBy === "time" ? "the latest rows by time" : "a seeded draw";
  const details = [
    ...(context.data === undefined ? [] : [{ name: "data", value: context.data }]),
    {
      name: "rows",
      value: `${result.trainRows} training, ${result.heldOutRows} held out (${held})`,
    },
    {
      name: "NE measured on",
      value:
        result.measure === "hybrid"
          ? "trees plus heads (heads learned at every step), on the held-out rows"
          : "each outcome's forest alone, on the held-out rows",
    },
  ];
  const findings = [
    result.dropped.length === 0
      ? `No feature could be dropped: every drop made held-out NE worse than the tolerance.`
      : `${result.dropped.length} of ${first.featuresKept} tree features dropped (${result.dropped.join(", ")}); ${result.kept.length} kept.`,
  ];
  return {
    title: context.title ?? "Leafcast feature pruning",
    details,
    findings,
    importance: first.importance.perForest,
    pruning: {
      steps: result.steps.map((s) => ({
        featuresKept: s.featuresKept,
        heldOutNe: s.heldOutNe,
        dropped: s.accepted ? s.dropped : s.dropped.map((name) => `${name} (not kept)`),
      })),
      schemaPath: context.schemaPath,
    },
  };
}
