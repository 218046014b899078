/**
 * The headline metrics of one outcome head over a set of rows. Weighted figures use
 * the row weights when given (rows and positives are plain counts).
 *
 * @example
 * const s: OutcomeSummary = summarizeOutcome(predicted, label, 0.04);
 * s.ne; // below 1 beats always predicting the training rate
 */
export interface OutcomeSummary {
  readonly rows: number;
  /** Rows whose label is 1. */
  readonly positives: number;
  /** Weighted observed positive rate. */
  readonly positiveRate: number;
  /** Weighted mean log loss, natural log, p clamped to [1e-15, 1 - 1e-15]. */
  readonly logLoss: number;
  /** Normalized entropy against the training positive rate (He et al. 2014). */
  readonly ne: number;
  /** Mean prediction over observed positive rate; 1 is perfect. */
  readonly calibration: number;
  /** ROC AUC, ties counted one half; NaN when one class is absent. */
  readonly auc: number;
  /**
   * Largest possible |auc - exact AUC|: 0 when computed from the scores, positive when
   * computed from a score histogram (see histogramAuc).
   */
  readonly aucErrorBound: number;
  readonly brier: number;
  /** Expected calibration error over equal-width bins of p (see expectedCalibrationError). */
  readonly ece: number;
}
