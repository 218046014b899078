import type { CategoryDictionary } from "../data/category-dictionary.js";
import type { MetricAccumulator } from "../metrics/metric-accumulator.js";
import type { HeadReport, NamedSummary } from "../report/report-input.js";

/** A baseline scored on the same rows as the model, per outcome it covers. */
export interface StudyBaseline {
  readonly name: string;
  readonly sinks: ReadonlyMap<string, MetricAccumulator>;
}

/**
 * The report's heads section from the study's accumulators: per outcome the
 * model's summary and reliability bins over every scored row, the baselines that
 * cover the outcome, and (when the accumulators kept segments) the model per value
 * of the segment column, decoded with its dictionary.
 *
 * @example
 * studyHeadReports(["open"], rates, deployed, [{ name: "trees only", sinks }], "post_type", dictionary);
 */
export function studyHeadReports(
  outcomes: readonly string[],
  trainingRate: ReadonlyMap<string, number>,
  model: ReadonlyMap<string, MetricAccumulator>,
  baselines: readonly StudyBaseline[],
  segmentColumn: string | null,
  dictionary: CategoryDictionary | undefined,
): HeadReport[] {
  return outcomes.flatMap((outcome): HeadReport[] => {
    const acc = model.get(outcome);
    const rate = trainingRate.get(outcome);
    if (acc === undefined || rate === undefined) return [];
    const { summary, reliability } = acc.overall(rate);
    if (summary.rows === 0) return [];
    const named: NamedSummary[] = baselines.flatMap((b) => {
      const sink = b.sinks.get(outcome);
      return sink === undefined ? [] : [{ name: b.name, summary: sink.overall(rate).summary }];
    });
    const segments =
      segmentColumn === null || dictionary === undefined
        ? undefined
        : {
            column: segmentColumn,
            groups: acc.segments(rate).map((s) => ({
              value: s.code < 0 ? "(missing)" : dictionary.valueOf(s.code),
              summary: s.summary,
            })),
          };
    return [
      { outcome, trainingRate: rate, overall: summary, reliability, baselines: named, segments },
    ];
  });
}
