import { chartFigure } from "./chart-figure.js";
import { escapeHtml } from "./escape-html.js";
import { forestPsiSpec } from "./forest-psi-spec.js";
import type { StalenessReport } from "./report-input.js";
import { treePsiSpec } from "./tree-psi-spec.js";

/**
 * The tree-staleness section: the verdict, forest leaf PSI over windows with the usual
 * reference lines, then one per-tree chart per forest. Empty string when there is no
 * staleness data.
 *
 * @example
 * html += await stalenessSection(input.staleness);
 */
export async function stalenessSection(report: StalenessReport | undefined): Promise<string> {
  if (report === undefined || report.forests.length === 0 || report.windows.length === 0) return "";
  const parts: string[] = [`<section id="staleness"><h2>Tree staleness</h2>\n`];
  if (report.verdict !== undefined) {
    const kind = report.verdict.refit ? "refit" : "keep";
    parts.push(
      `<p class="verdict ${kind}"><strong>${report.verdict.refit ? "Refit" : "Keep"}:</strong> ${escapeHtml(report.verdict.reason)}</p>\n`,
    );
  }
  parts.push(
    `<p class="note">Population Stability Index of the share of rows reaching each leaf, the trees' fit window against each later window. Usual reading: below 0.10 stable, 0.10 to 0.25 moderate shift, above 0.25 significant shift.</p>\n`,
  );
  parts.push(await chartFigure(forestPsiSpec(report), "forest-psi", "chart-forest-psi"));
  parts.push(`<div class="grid">\n`);
  for (let i = 0; i < report.forests.length; i++) {
    parts.push(
      await chartFigure(
        treePsiSpec(report.windows, report.forests[i]),
        "tree-psi",
        `chart-tree-psi-${i}`,
      ),
    );
  }
  parts.push(`</div></section>\n`);
  return parts.join("");
}
