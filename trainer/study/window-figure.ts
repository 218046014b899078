import type { OutcomeSummary } from "../metrics/outcome-summary.js";
import type { FreshnessArm, FreshnessFigure } from "../report/report-input.js";

/** One (outcome, arm, window) of the study: what the report draws, plus log loss and rows. */
export interface WindowFigure extends FreshnessFigure {
  readonly logLoss: number;
  readonly rows: number;
  readonly positiveRate: number;
}

/** A WindowFigure over the rows of one value of the segment column. */
export interface SegmentWindowFigure extends WindowFigure {
  readonly segment: string;
}

/**
 * The study's figure of one arm on one window from the summary of its rows.
 *
 * @example
 * windowFigure("open", "frozen", 2, accumulator.overall(0.2).summary).ne;
 */
export function windowFigure(
  outcome: string,
  arm: FreshnessArm,
  window: number,
  s: OutcomeSummary,
): WindowFigure {
  return {
    outcome,
    arm,
    window,
    ne: s.ne,
    calibration: s.calibration,
    logLoss: s.logLoss,
    rows: s.rows,
    positiveRate: s.positiveRate,
  };
}
