import { chartFigure } from "./chart-figure.js";
import { escapeHtml } from "./escape-html.js";
import { formatFigure } from "./format-figure.js";
import { reliabilitySpec } from "./reliability-spec.js";
import type { HeadReport } from "./report-input.js";
import { summaryTableHtml } from "./summary-table-html.js";

/**
 * The outcome-heads section: the heads' reliability diagrams, then per head its summary
 * table. Empty string when there are no heads.
 *
 * @example
 * html += await headsSection(input.heads);
 */
export async function headsSection(heads: readonly HeadReport[] | undefined): Promise<string> {
  if (heads === undefined || heads.length === 0) return "";
  const parts: string[] = [`<section id="heads"><h2>Outcome heads</h2>\n`];
  // The diagrams sit together in a grid, where heads compare at a glance; the tables are
  // too wide to share a row with them.
  const figures: string[] = [];
  for (let i = 0; i < heads.length; i++) {
    const bins = heads[i].reliability;
    if (bins === undefined) continue;
    figures.push(
      await chartFigure(
        reliabilitySpec(heads[i].outcome, bins),
        "reliability",
        `chart-reliability-${i}`,
      ),
    );
  }
  if (figures.some((f) => f !== "")) {
    parts.push(
      `<h3>Reliability</h3>\n<p class="note">Mean prediction against observed positive rate per equal-width bin of the prediction; point area by rows; the dashed diagonal is perfect calibration.</p>\n`,
      `<div class="grid">\n${figures.join("")}</div>\n`,
    );
  }
  for (let i = 0; i < heads.length; i++) {
    const head = heads[i];
    const rate =
      head.trainingRate === undefined
        ? ""
        : `<p class="note">Training positive rate ${formatFigure(head.trainingRate, "percent")}: the reference of NE, so NE below 1 beats always predicting it.</p>`;
    parts.push(
      `<article class="head" id="head-${i}"><h3>${escapeHtml(head.outcome)}</h3>${rate}` +
        `${summaryTableHtml(head)}</article>\n`,
    );
  }
  parts.push(`</section>\n`);
  return parts.join("");
}
