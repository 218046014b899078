import { psiReading } from "../metrics/psi-reading.js";
import { formatFigure } from "./format-figure.js";
import { recoveryShares } from "./recovery-shares.js";
import { recoverySentence } from "./recovery-sentence.js";
import type { ReportInput, StalenessReport } from "./report-input.js";
import { terminalText } from "./terminal-text.js";

/**
 * The report's short text form for the terminal, from the same input as renderReport:
 * findings, one line per head, what head updates recover, the staleness verdict,
 * unused features, pruning and latency. Sections without data are left out. User text
 * is cleaned of control characters (see terminalText).
 *
 * @example
 * process.stdout.write(summarizeReport(input));
 */
export function summarizeReport(input: ReportInput): string {
  const t = terminalText;
  const lines: string[] = [t(input.title ?? "Leafcast report")];
  if (input.subtitle !== undefined) lines.push(t(input.subtitle));

  if (input.findings !== undefined && input.findings.length > 0) {
    lines.push("", "Findings:", ...input.findings.map((f) => `  - ${t(f)}`));
  }

  const heads = input.heads ?? [];
  if (heads.length > 0) {
    const width = Math.min(24, Math.max(7, ...heads.map((h) => t(h.outcome).length)));
    lines.push(
      "",
      `  ${"outcome".padEnd(width)}  ${"NE".padStart(7)}  ${"calib.".padStart(7)}  ${"AUC".padStart(7)}  rows`,
    );
    for (const h of heads) {
      const s = h.overall;
      lines.push(
        `  ${t(h.outcome).padEnd(width)}  ${formatFigure(s.ne, "metric").padStart(7)}  ` +
          `${formatFigure(s.calibration, "metric").padStart(7)}  ${formatFigure(s.auc, "metric").padStart(7)}  ` +
          formatFigure(s.rows, "count"),
      );
    }
  }

  const recovery = input.freshness?.recovery ?? [];
  if (recovery.length > 0) {
    lines.push("", "Freshness (NE lost to drift):");
    for (const r of recovery) {
      const shares = recoveryShares(r);
      lines.push(
        shares === null
          ? `  ${t(r.outcome)}: no NE lost to drift`
          : `  ${t(r.outcome)}: ${recoverySentence(shares)}`,
      );
    }
  }

  const staleness = stalenessLine(input.staleness);
  if (staleness !== null) lines.push("", `Staleness: ${staleness}`);

  const forests = input.importance ?? [];
  if (forests.length > 0) {
    const usedSomewhere = new Set(
      forests.flatMap((f) => f.features.filter((x) => x.splits > 0).map((x) => x.feature)),
    );
    const all = [...new Set(forests.flatMap((f) => f.features.map((x) => x.feature)))];
    const unused = all.filter((name) => !usedSomewhere.has(name));
    lines.push(
      "",
      unused.length === 0
        ? `Features: every one of ${all.length} is split on by some tree`
        : `Features: ${unused.length} of ${all.length} unused by every forest: ${unused.map(t).join(", ")}`,
    );
  }

  const steps = input.pruning?.steps ?? [];
  if (steps.length > 0) {
    const first = steps[0];
    const last = steps[steps.length - 1];
    const ne = Object.keys(last.heldOutNe).map(
      (o) =>
        `${t(o)} ${formatFigure(first.heldOutNe[o] ?? NaN, "metric")} -> ${formatFigure(last.heldOutNe[o], "metric")}`,
    );
    lines.push(
      "",
      `Pruning: ${first.featuresKept} -> ${last.featuresKept} features, held-out NE ${ne.join(", ")}`,
    );
    if (input.pruning?.schemaPath !== undefined)
      lines.push(`  reduced schema: ${t(input.pruning.schemaPath)}`);
  }

  const latency = input.latency;
  if (latency !== undefined) {
    const p = latency.perItem;
    const batches = (latency.batches ?? []).map(
      (b) =>
        `; batch of ${formatFigure(b.batchSize, "count")}: ${formatFigure(b.nsPerItem, "ns")} per item`,
    );
    lines.push(
      "",
      `Latency: one item p50 ${formatFigure(p.p50, "ns")}, p90 ${formatFigure(p.p90, "ns")}, p99 ${formatFigure(p.p99, "ns")}, ` +
        `p99.9 ${formatFigure(p.p999, "ns")}, max ${formatFigure(p.max, "ns")}${batches.join("")}`,
    );
  }
  return lines.join("\n") + "\n";
}

/** The verdict when given, else the worst forest of the latest window with its reading. */
function stalenessLine(report: StalenessReport | undefined): string | null {
  if (report === undefined || report.forests.length === 0 || report.windows.length === 0)
    return null;
  if (report.verdict !== undefined) return terminalText(report.verdict.reason);
  const last = report.windows.length - 1;
  let worst: { forest: string; psi: number } | null = null;
  for (const series of report.forests) {
    const psi = series.perWindow[last]?.forest;
    if (psi !== undefined && Number.isFinite(psi) && (worst === null || psi > worst.psi))
      worst = { forest: series.forest, psi };
  }
  if (worst === null) return null;
  return (
    `largest forest leaf PSI in ${terminalText(report.windows[last])} is ${formatFigure(worst.psi, "psi")} ` +
    `(${psiReading(worst.psi)}), forest ${terminalText(worst.forest)}`
  );
}
