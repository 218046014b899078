import { chartFigure } from "./chart-figure.js";
import { escapeHtml } from "./escape-html.js";
import { formatFigure } from "./format-figure.js";
import { freshnessSpec } from "./freshness-spec.js";
import { recoveryShares } from "./recovery-shares.js";
import type { FreshnessRecovery, FreshnessReport } from "./report-input.js";

/**
 * The freshness-study section: NE and calibration per window for the three arms and
 * every outcome, then the recovery table. Empty string when there is no study.
 *
 * @example
 * html += await freshnessSection(input.freshness);
 */
export async function freshnessSection(study: FreshnessReport | undefined): Promise<string> {
  if (study === undefined || (study.figures.length === 0 && (study.recovery ?? []).length === 0))
    return "";
  const parts: string[] = [
    `<section id="freshness"><h2>Freshness study</h2>\n`,
    `<p class="note">Logs replayed in ${study.windows.length} windows. Frozen trees and heads show the loss from drift; updating the heads every window shows how much of it the heads win back; refitting the trees every window shows what is left to the trees.</p>\n`,
  ];
  parts.push(await chartFigure(freshnessSpec(study), "freshness", "chart-freshness"));
  if (study.recovery !== undefined && study.recovery.length > 0) {
    parts.push(recoveryTable(study.recovery));
  }
  parts.push(`</section>\n`);
  return parts.join("");
}

function recoveryTable(recovery: readonly FreshnessRecovery[]): string {
  const rows = recovery.map((r) => {
    const shares = recoveryShares(r);
    const cells = [
      formatFigure(r.frozenNe, "metric"),
      formatFigure(r.headsUpdatedNe, "metric"),
      formatFigure(r.treesRefitNe, "metric"),
      shares === null ? "none" : formatFigure(shares.lost, "metric"),
      shares === null ? "n/a" : shareText(shares.recovered),
      shares === null ? "n/a" : shareText(shares.leftToTrees),
    ];
    return `<tr><th scope="row">${escapeHtml(r.outcome)}</th>${cells.map((c) => `<td>${c}</td>`).join("")}</tr>`;
  });
  return (
    `<h3>Loss from drift: what head updates recover</h3>\n<div class="table-wrap"><table class="summary">` +
    `<thead><tr><th scope="col">outcome</th><th scope="col">NE frozen</th><th scope="col">NE heads updated</th>` +
    `<th scope="col">NE trees refit</th><th scope="col">NE lost to drift</th>` +
    `<th scope="col">recovered by head updates</th><th scope="col">left to the trees</th></tr></thead>` +
    `<tbody>${rows.join("")}</tbody></table></div>\n`
  );
}

/** A share as a percentage, clipped at the ends: past them the arms crossed (see recoverySentence). */
function shareText(share: number): string {
  if (share > 1) return "over 100 %";
  if (share < 0) return "below 0 %";
  return formatFigure(share, "percent");
}
