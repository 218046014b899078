import type { SegmentWindowFigure } from "./window-figure.js";

/** A segment's rows over the windows must reach this before its NE is trusted. */
const MIN_SEGMENT_ROWS = 1000;
/** Refit NE this much below the updated heads' (relative) counts as a gap. */
const MIN_RELATIVE_GAP = 0.02;
/** Findings kept, the widest gaps first. */
const MAX_FINDINGS = 3;

/** What segmentGapFindings reads. */
export interface SegmentGapInput {
  readonly segmentFigures: readonly SegmentWindowFigure[];
  /** The segment column, e.g. "post_type". */
  readonly segmentColumn: string;
  /** Indexes of the windows to average (those after the drift). */
  readonly windows: readonly number[];
  /** The same windows as one label, e.g. "days 22-42". */
  readonly span: string;
}

/**
 * Where updated heads fall short of refit trees on one segment's rows: a drift
 * that new trees can learn and a head over old leaves cannot (a new post type
 * whose rows need splits the old trees never made) hides in the overall figures
 * when the segment is small. Per segment value and outcome, NE of each arm is
 * averaged over the chosen windows weighted by rows; a finding is written when
 * refitting beats the updated heads by at least 2 % on at least 1,000 rows, the
 * three widest gaps first.
 *
 * @example
 * segmentGapFindings({ segmentFigures, segmentColumn: "post_type", windows: [3, 4, 5], span: "days 22-42" });
 * // ["on post_type = plot_tour rows, refitting the trees beats the updated heads for react: NE 1.1300 refit against 1.1970 heads updated (5.6 % lower, 8,112 rows, days 22-42): a gap only refitting closes"]
 */
export function segmentGapFindings(input: SegmentGapInput): string[] {
  const chosen = new Set(input.windows);
  const sums = new Map<string, { segment: string; outcome: string; updated: Sum; refit: Sum }>();
  for (const f of input.segmentFigures) {
    if (!chosen.has(f.window) || !(f.rows > 0) || !Number.isFinite(f.ne)) continue;
    if (f.arm === "frozen") continue;
    const key = `${f.segment}\u0000${f.outcome}`;
    let entry = sums.get(key);
    if (entry === undefined) {
      entry = { segment: f.segment, outcome: f.outcome, updated: new Sum(), refit: new Sum() };
      sums.set(key, entry);
    }
    (f.arm === "heads-updated" ? entry.updated : entry.refit).add(f.ne, f.rows);
  }
  const gaps = [...sums.values()]
    .filter((e) => e.updated.rows >= MIN_SEGMENT_ROWS && e.updated.rows === e.refit.rows)
    .map((e) => ({ ...e, gap: 1 - e.refit.mean() / e.updated.mean() }))
    .filter((e) => e.gap >= MIN_RELATIVE_GAP)
    .sort((a, b) => b.gap - a.gap)
    .slice(0, MAX_FINDINGS);
  return gaps.map(
    (e) =>
      `on ${input.segmentColumn} = ${e.segment} rows, refitting the trees beats the updated heads for ${e.outcome}: ` +
      `NE ${e.refit.mean().toFixed(4)} refit against ${e.updated.mean().toFixed(4)} heads updated ` +
      `(${(100 * e.gap).toFixed(1)} % lower, ${e.updated.rows.toLocaleString("en-US")} rows, ${input.span}): ` +
      `a gap only refitting closes`,
  );
}

/** A row-weighted mean. */
class Sum {
  private total = 0;
  rows = 0;

  add(value: number, rows: number): void {
    this.total += value * rows;
    this.rows += rows;
  }

  mean(): number {
    return this.total / this.rows;
  }
}
