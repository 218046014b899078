import { chartFigure } from "./chart-figure.js";
import { escapeHtml } from "./escape-html.js";
import { formatFigure } from "./format-figure.js";
import { pruningSpec } from "./pruning-spec.js";
import type { PruningReport } from "./report-input.js";

/**
 * The feature-pruning section: held-out NE against features kept, and a table of the
 * steps with the features each one dropped. Empty string when there are no steps.
 *
 * @example
 * html += await pruningSection(input.pruning);
 */
export async function pruningSection(report: PruningReport | undefined): Promise<string> {
  if (report === undefined || report.steps.length === 0) return "";
  const outcomes = [...new Set(report.steps.flatMap((s) => Object.keys(s.heldOutNe)))];
  const header = outcomes.map((o) => `<th scope="col">NE ${escapeHtml(o)}</th>`).join("");
  const rows = report.steps.map((step) => {
    const ne = outcomes.map((o) => `<td>${formatFigure(step.heldOutNe[o] ?? NaN, "metric")}</td>`);
    const dropped = step.dropped.map((name) => `<code>${escapeHtml(name)}</code>`).join(", ");
    return `<tr><th scope="row">${formatFigure(step.featuresKept, "count")}</th>${ne.join("")}<td class="text">${dropped}</td></tr>`;
  });
  const schema =
    report.schemaPath === undefined
      ? ""
      : `<p class="note">Reduced schema written to <code>${escapeHtml(report.schemaPath)}</code>.</p>\n`;
  return (
    `<section id="pruning"><h2>Feature pruning</h2>\n` +
    (await chartFigure(pruningSpec(report), "pruning", "chart-pruning")) +
    `<div class="table-wrap"><table class="summary"><thead><tr><th scope="col">features kept</th>${header}` +
    `<th scope="col" class="text">dropped at this step</th></tr></thead><tbody>${rows.join("")}</tbody></table></div>\n` +
    schema +
    `</section>\n`
  );
}
