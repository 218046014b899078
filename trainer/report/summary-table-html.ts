import type { OutcomeSummary } from "../metrics/outcome-summary.js";
import { escapeHtml } from "./escape-html.js";
import { formatFigure } from "./format-figure.js";
import type { HeadReport } from "./report-input.js";

const COLUMNS = [
  "rows",
  "positives",
  "positive rate",
  "log loss",
  "NE",
  "calibration",
  "AUC",
  "Brier",
  "ECE",
];

/**
 * The OutcomeSummary table of one head: the model over every row, each baseline, then
 * one row per segment value under a heading row naming the column.
 *
 * @example
 * html += summaryTableHtml({ outcome: "reply", overall: summary, segments: { column: "post_type", groups } });
 */
export function summaryTableHtml(head: HeadReport): string {
  const rows: string[] = [row("model, all rows", head.overall, "model")];
  for (const baseline of head.baselines ?? []) {
    rows.push(row(`baseline: ${baseline.name}`, baseline.summary, "baseline"));
  }
  if (head.segments !== undefined && head.segments.groups.length > 0) {
    rows.push(
      `<tr class="group"><th colspan="${COLUMNS.length + 1}" scope="rowgroup">model by ${escapeHtml(head.segments.column)}</th></tr>`,
    );
    for (const group of head.segments.groups) rows.push(row(group.value, group.summary, "segment"));
  }
  const header = COLUMNS.map((c) => `<th scope="col">${c}</th>`).join("");
  return (
    `<div class="table-wrap"><table class="summary">` +
    `<thead><tr><th scope="col"></th>${header}</tr></thead>` +
    `<tbody>${rows.join("")}</tbody></table></div>\n`
  );
}

function row(label: string, s: OutcomeSummary, kind: string): string {
  const auc =
    s.aucErrorBound > 0 && Number.isFinite(s.auc)
      ? `${formatFigure(s.auc, "metric")}<span class="bound"> ±${s.aucErrorBound.toPrecision(1)}</span>`
      : formatFigure(s.auc, "metric");
  const cells = [
    formatFigure(s.rows, "count"),
    formatFigure(s.positives, "count"),
    formatFigure(s.positiveRate, "percent"),
    formatFigure(s.logLoss, "metric"),
    formatFigure(s.ne, "metric"),
    formatFigure(s.calibration, "metric"),
    auc,
    formatFigure(s.brier, "metric"),
    formatFigure(s.ece, "metric"),
  ];
  return `<tr class="${kind}"><th scope="row">${escapeHtml(label)}</th>${cells.map((c) => `<td>${c}</td>`).join("")}</tr>`;
}
