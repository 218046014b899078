import type { LatencyReport, ReportDetail, ReportInput } from "../report/report-input.js";
import type { FreshnessStudy } from "./run-freshness-study.js";

/** What the page adds to the study's own figures. */
export interface StudyReportExtras {
  readonly title?: string;
  readonly subtitle?: string;
  /** Facts shown after the study's own (fit span, windows, rows). */
  readonly details?: readonly ReportDetail[];
  readonly latency?: LatencyReport;
}

/**
 * The report input of a freshness study: findings, the heads section (the
 * deployed arm with its baselines and reliability bins), the freshness charts with
 * the recovery table, tree staleness and the frozen forests' importance.
 *
 * @example
 * await writeReport("runs/demo/report.html", studyReportInput(study, { title: "Plotline demo" }));
 */
export function studyReportInput(
  study: FreshnessStudy,
  extras: StudyReportExtras = {},
): ReportInput {
  const windows = study.windows;
  const details: ReportDetail[] = [
    {
      name: "trees and first heads fit on",
      value: `${study.fitLabel} (${study.fitFiles.length} files)`,
    },
    {
      name: "windows scored",
      value: `${windows.length}, ${windows[0].label} to ${windows[windows.length - 1].label}, ${study.rowsScored} rows`,
    },
    {
      name: "heads section",
      value: "frozen trees, heads updated day by day, each day scored before they learn it",
    },
    {
      name: "NE reference",
      value: `positive rate of ${study.fitLabel}: ${study.outcomes.map((o) => `${o} ${((study.trainingRate.get(o) ?? NaN) * 100).toFixed(2)} %`).join(", ")}`,
    },
    ...(extras.details ?? []),
  ];
  return {
    title: extras.title,
    subtitle: extras.subtitle,
    details,
    findings: study.findings,
    heads: study.heads,
    freshness: {
      windows: windows.map((w) => w.label),
      windowUnit: "window",
      figures: study.figures,
      recovery: study.recovery,
    },
    staleness: study.staleness,
    importance: study.importance,
    latency: extras.latency,
  };
}
