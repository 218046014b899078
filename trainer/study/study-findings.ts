import { psiReading } from "../metrics/psi-reading.js";
import { recoveryShares } from "../report/recovery-shares.js";
import type { FreshnessRecovery, StalenessReport } from "../report/report-input.js";

/** What the findings are written from. */
export interface StudyFindingsInput {
  readonly recovery: readonly FreshnessRecovery[];
  /** The windows the recovery averages, as one label, e.g. "days 22-42". */
  readonly recoverySpan: string;
  readonly staleness: StalenessReport;
  /** With a segment column: where refitting beats the updated heads on one segment (segmentGapFindings). */
  readonly segmentGaps?: readonly string[];
}

/**
 * The study's findings as plain sentences: per outcome how much of the NE lost to
 * drift head updates recover and how much is left to the trees, then the segments
 * where only refitting closes a gap, then when the trees' leaf PSI first reached
 * the refit threshold (or that it never did).
 *
 * @example
 * studyFindings({ recovery, recoverySpan: "days 22-42", staleness });
 * // ["head updates recover 84 % of the NE lost to drift for open; 16 % is left to the trees (NE lost 0.0121, days 22-42)", ...]
 */
export function studyFindings(input: StudyFindingsInput): string[] {
  const lines: string[] = [];
  for (const r of input.recovery) {
    const shares = recoveryShares(r);
    if (shares === null) {
      lines.push(
        `no NE lost to drift for ${r.outcome} over ${input.recoverySpan}: refitting the trees every window did not beat the frozen model (NE ${r.frozenNe.toFixed(4)} frozen, ${r.treesRefitNe.toFixed(4)} refit)`,
      );
      continue;
    }
    const figures = `NE ${r.frozenNe.toFixed(4)} frozen, ${r.headsUpdatedNe.toFixed(4)} heads updated, ${r.treesRefitNe.toFixed(4)} trees refit, ${input.recoverySpan}`;
    if (shares.recovered > 1) {
      lines.push(
        `head updates alone beat refitting the trees every window for ${r.outcome}: nothing of the NE lost to drift is left to the trees (${figures})`,
      );
    } else if (shares.recovered < 0) {
      lines.push(
        `head updates recover none of the NE lost to drift for ${r.outcome}; only refitting the trees does (${figures})`,
      );
    } else {
      lines.push(
        `head updates recover ${percent(shares.recovered)} of the NE lost to drift for ${r.outcome}; ` +
          `${percent(shares.leftToTrees)} is left to the trees (NE lost ${shares.lost.toFixed(4)}, ${input.recoverySpan})`,
      );
    }
  }
  lines.push(...(input.segmentGaps ?? []));
  const staleness = stalenessFinding(input.staleness);
  if (staleness !== null) lines.push(staleness);
  return lines;
}

function reading(psi: number): string {
  const r = psiReading(psi);
  return r === "stable" ? "stable" : `${r} shift`;
}

function percent(share: number): string {
  return `${Math.round(100 * share)} %`;
}

/** The first window where some forest's PSI reached the threshold, or the largest PSI seen. */
function stalenessFinding(report: StalenessReport): string | null {
  const threshold = report.threshold ?? 0.25;
  let largest: { forest: string; window: number; psi: number } | null = null;
  for (let w = 0; w < report.windows.length; w++) {
    let worst: { forest: string; psi: number } | null = null;
    for (const series of report.forests) {
      const psi = series.perWindow[w].forest;
      if (worst === null || psi > worst.psi) worst = { forest: series.forest, psi };
      if (largest === null || psi > largest.psi)
        largest = { forest: series.forest, window: w, psi };
    }
    if (worst !== null && worst.psi >= threshold) {
      return (
        `the trees went stale in ${report.windows[w]}: forest ${worst.forest} has leaf PSI ${worst.psi.toFixed(3)} ` +
        `(${reading(worst.psi)}), at or above the refit threshold ${threshold}; refit the trees`
      );
    }
  }
  if (largest === null) return null;
  return (
    `the trees stayed below the refit threshold ${threshold} in every window: the largest leaf PSI is ` +
    `${largest.psi.toFixed(3)} (${reading(largest.psi)}), forest ${largest.forest} in ${report.windows[largest.window]}`
  );
}
