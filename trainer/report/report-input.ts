import type { OutcomeSummary } from "../metrics/outcome-summary.js";
import type { FeatureImportance } from "../trees/feature-importance.js";

/**
 * Everything the visual report shows. Every section is optional: a section whose data
 * is absent is left out of the page and out of the text summary. The renderer reads no
 * clock and no files, so the same input always gives the same HTML.
 *
 * Strings that come from user data (outcome names, segment values, feature names) are
 * escaped by the renderer; pass them as they are.
 *
 * @example
 * const input: ReportInput = {
 *   title: "Plotline engagement, May",
 *   findings: ["Head updates recover most of the NE lost to drift."],
 *   heads: [{ outcome: "reply", trainingRate: 0.031, overall: summarizeOutcome(p, y, 0.031) }],
 * };
 * await writeReport("runs/may/report.html", input);
 */
export interface ReportInput {
  /** Page title; default "Leafcast report". */
  readonly title?: string;
  /**
   * One line under the title, shown as given, e.g. "generated 2024-06-01 08:00 UTC". The
   * renderer never adds a timestamp itself.
   */
  readonly subtitle?: string;
  /** Facts about the run (data file, rows, model), shown as a name/value list. */
  readonly details?: readonly ReportDetail[];
  /** Short findings in plain sentences, shown first and printed by summarizeReport. */
  readonly findings?: readonly string[];
  /** Per outcome head: the summary table and a reliability diagram. */
  readonly heads?: readonly HeadReport[];
  /** The freshness study: NE and calibration per window for the three arms. */
  readonly freshness?: FreshnessReport;
  /** Tree staleness: leaf PSI per tree and per forest over windows. */
  readonly staleness?: StalenessReport;
  /** Feature importance, one entry per forest. */
  readonly importance?: readonly ForestImportance[];
  /** The feature-pruning loop: held-out NE against the number of features kept. */
  readonly pruning?: PruningReport;
  /** Scorer latency from an artifact benchmark. */
  readonly latency?: LatencyReport;
}

/** A name/value fact, e.g. { name: "data", value: "plots-may.parquet" }. */
export interface ReportDetail {
  readonly name: string;
  readonly value: string;
}

/** The figures of one outcome head. */
export interface HeadReport {
  /** Outcome name, e.g. "reply". */
  readonly outcome: string;
  /** Training positive rate: the reference of NE (He et al. 2014). Shown beside the table. */
  readonly trainingRate?: number;
  /** The model over every evaluated row. */
  readonly overall: OutcomeSummary;
  /** Reliability bins of the model over every row; omit for no diagram. */
  readonly reliability?: ReportReliability;
  /**
   * Baselines scored on the same rows, shown under the model row, e.g. "training
   * positive rate", "trees only", "heads on hashed ids only".
   */
  readonly baselines?: readonly NamedSummary[];
  /** The model per value of one column. */
  readonly segments?: SegmentTable;
}

/**
 * Reliability bins; the metrics package's ReliabilityBins fits as is. Bins with no rows
 * (count 0) or a non-finite figure are not drawn.
 */
export interface ReportReliability {
  readonly count: ArrayLike<number>;
  readonly meanPredicted: ArrayLike<number>;
  readonly observedRate: ArrayLike<number>;
}

/** An OutcomeSummary with a row label. */
export interface NamedSummary {
  readonly name: string;
  readonly summary: OutcomeSummary;
}

/** Summaries per value of one column (from MetricAccumulator.segments, codes decoded). */
export interface SegmentTable {
  /** The column the rows were grouped by, e.g. "post_type". */
  readonly column: string;
  /** One row per value, in the order to show; name the missing value e.g. "(missing)". */
  readonly groups: readonly SegmentSummary[];
}

export interface SegmentSummary {
  readonly value: string;
  readonly summary: OutcomeSummary;
}

/** The three arms of the freshness study. */
export type FreshnessArm = "frozen" | "heads-updated" | "trees-refit";

/**
 * How each arm is named on the page, in the order the arms are drawn.
 *
 * @example
 * FRESHNESS_ARM_LABELS["heads-updated"]; // "frozen trees, heads updated"
 */
export const FRESHNESS_ARM_LABELS: Readonly<Record<FreshnessArm, string>> = {
  frozen: "frozen trees and heads",
  "heads-updated": "frozen trees, heads updated",
  "trees-refit": "trees refit",
};

/** The freshness study: replayed windows, scored by each arm. */
export interface FreshnessReport {
  /** Window labels in time order, e.g. "2024-05-06"; FreshnessFigure.window indexes it. */
  readonly windows: readonly string[];
  /** What one window is, for axis titles: "day", "week"; default "window". */
  readonly windowUnit?: string;
  /** One figure per (outcome, arm, window); a missing combination is simply not drawn. */
  readonly figures: readonly FreshnessFigure[];
  /** Per outcome, how much of the NE lost to drift head updates recover. */
  readonly recovery?: readonly FreshnessRecovery[];
}

export interface FreshnessFigure {
  readonly outcome: string;
  readonly arm: FreshnessArm;
  /** Index into FreshnessReport.windows. */
  readonly window: number;
  readonly ne: number;
  /** Mean prediction over observed rate; 1 is perfect. */
  readonly calibration: number;
}

/**
 * Mean NE of each arm over the windows after the drift (the study chooses them). The
 * report reads: lost to drift = frozen - refit; recovered by head updates =
 * (frozen - headsUpdated) / lost; left to the trees = (headsUpdated - refit) / lost.
 */
export interface FreshnessRecovery {
  readonly outcome: string;
  readonly frozenNe: number;
  readonly headsUpdatedNe: number;
  readonly treesRefitNe: number;
}

/** Leaf PSI of every forest, fit window against each later window. */
export interface StalenessReport {
  /** Labels of the windows compared with the trees' fit window, in time order. */
  readonly windows: readonly string[];
  /** One series per forest (usually one forest per outcome). */
  readonly forests: readonly ForestPsiSeries[];
  /** The refit threshold on forest PSI, drawn when it is not 0.10 or 0.25; default 0.25. */
  readonly threshold?: number;
  /** The verdict for the latest window, e.g. from staleness() in the metrics package. */
  readonly verdict?: { readonly refit: boolean; readonly reason: string };
}

export interface ForestPsiSeries {
  readonly forest: string;
  /** One entry per window (same length as StalenessReport.windows); a LeafPsi fits as is. */
  readonly perWindow: readonly WindowPsi[];
}

export interface WindowPsi {
  /** PSI of each tree's leaf shares; every window of a forest has the same tree count. */
  readonly perTree: ArrayLike<number>;
  /** The forest's PSI (LeafPsi.forest: the mean over trees). */
  readonly forest: number;
}

/** Importance of every feature in one forest (featureImportance in the trees package). */
export interface ForestImportance {
  readonly forest: string;
  readonly features: readonly FeatureImportance[];
}

/** The pruning loop, one step per refit. */
export interface PruningReport {
  /** Steps in the order run, usually from all features down. */
  readonly steps: readonly PruningStep[];
  /** Where the reduced schema was written, shown as text. */
  readonly schemaPath?: string;
}

export interface PruningStep {
  readonly featuresKept: number;
  /** Held-out NE per outcome at this step. */
  readonly heldOutNe: Readonly<Record<string, number>>;
  /** Features dropped to reach this step (empty for the first). */
  readonly dropped: readonly string[];
}

/** Scorer latency, nanoseconds. */
export interface LatencyReport {
  /** What was timed, e.g. "one item, 120 trees of depth 6, 6 heads, Node 20". */
  readonly description?: string;
  /** Per-call latency of scoring one item. */
  readonly perItem: LatencyPercentiles;
  /** Batch scoring: nanoseconds per item at each batch size. */
  readonly batches?: readonly LatencyBatch[];
}

export interface LatencyPercentiles {
  readonly p50: number;
  readonly p90: number;
  readonly p99: number;
  readonly p999: number;
  readonly max: number;
  /** Calls timed. */
  readonly calls?: number;
}

export interface LatencyBatch {
  readonly batchSize: number;
  readonly nsPerItem: number;
}
