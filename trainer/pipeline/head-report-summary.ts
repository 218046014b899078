import type { HeadProgressiveReport, ProgressiveFigures } from "../heads/progressive-report.js";

/** The figures the head commands print for one head. */
export interface HeadSummary {
  readonly outcome: string;
  readonly overall: SummaryFigures;
  /** The last time slice seen, or null when the rows had no timestamps. */
  readonly lastSlice: (SummaryFigures & { readonly start: string; readonly end: string }) | null;
}

export interface SummaryFigures {
  readonly rows: number;
  readonly logLoss: number | null;
  readonly normalizedEntropy: number | null;
  readonly calibration: number | null;
  readonly positiveRate: number | null;
}

/**
 * Per head: progressive log loss, normalized entropy and calibration, overall
 * and for the last time slice. Non-finite figures (no rows, no positives)
 * become null, so the summary is valid JSON.
 *
 * @example
 * headReportSummary(progressiveReport(state))[0].overall.normalizedEntropy; // 0.83
 */
export function headReportSummary(report: readonly HeadProgressiveReport[]): HeadSummary[] {
  return report.map((head) => {
    const last = head.slices.length > 0 ? head.slices[head.slices.length - 1] : null;
    return {
      outcome: head.outcome,
      overall: figuresOf(head.overall),
      lastSlice:
        last === null
          ? null
          : {
              start: new Date(last.start).toISOString(),
              end: new Date(last.end).toISOString(),
              ...figuresOf(last),
            },
    };
  });
}

/**
 * Readable lines of a summary: one per head, overall then last slice.
 *
 * @example
 * renderHeadSummary(headReportSummary(progressiveReport(state)));
 * // "  open: log loss 0.43512, NE 0.9051, calibration 0.998 (120000 rows); last slice from ..."
 */
export function renderHeadSummary(summary: readonly HeadSummary[]): string {
  const show = (x: number | null, digits: number): string =>
    x === null ? "n/a" : x.toFixed(digits);
  const part = (f: SummaryFigures): string =>
    `log loss ${show(f.logLoss, 5)}, NE ${show(f.normalizedEntropy, 4)}, calibration ${show(f.calibration, 3)} (${f.rows} rows)`;
  return summary
    .map(
      (h) =>
        `  ${h.outcome}: ${part(h.overall)}` +
        (h.lastSlice === null
          ? ""
          : `; last slice from ${h.lastSlice.start}: ${part(h.lastSlice)}`),
    )
    .join("\n");
}

function figuresOf(f: ProgressiveFigures): SummaryFigures {
  const finite = (x: number): number | null => (Number.isFinite(x) ? x : null);
  return {
    rows: f.rows,
    logLoss: finite(f.logLoss),
    normalizedEntropy: finite(f.normalizedEntropy),
    calibration: finite(f.calibration),
    positiveRate: finite(f.positiveRate),
  };
}
