import { LeafcastError, type Issue } from "../errors.js";
import type { MetricColumns } from "./metric-accumulator.js";

/**
 * Checks the grouping columns of a MetricAccumulator batch of `n` rows: timestamps
 * (finite epoch milliseconds) when slicing, segment codes (>= -1) when segmenting.
 * Throws one LeafcastError listing every problem; the first bad entry of each column
 * is quoted.
 *
 * @example
 * checkMetricColumns(1, { timestampMs: Float64Array.of(NaN) }, true, false);
 * // throws: metrics: MetricAccumulator.add: timestampMs expected epoch milliseconds, found NaN (index 0)
 */
export function checkMetricColumns(
  n: number,
  columns: MetricColumns,
  slicing: boolean,
  segmenting: boolean,
): void {
  const { timestampMs, segment } = columns;
  const issues: Issue[] = [];
  if (slicing && requireColumn(issues, "timestampMs", timestampMs, n)) {
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(timestampMs[i])) {
        issues.push({
          code: "bad_timestamp",
          message: `MetricAccumulator.add: timestampMs expected epoch milliseconds, found ${timestampMs[i]} (index ${i})`,
        });
        break;
      }
    }
  }
  if (segmenting && requireColumn(issues, "segment", segment, n)) {
    for (let i = 0; i < n; i++) {
      if (segment[i] < -1) {
        issues.push({
          code: "bad_segment",
          message: `MetricAccumulator.add: segment expected a category code >= -1, found ${segment[i]} (index ${i})`,
        });
        break;
      }
    }
  }
  if (issues.length > 0) throw new LeafcastError("metrics", issues);
}

/** True when the column is there with one entry per row; otherwise records why not. */
function requireColumn<T extends ArrayLike<number>>(
  issues: Issue[],
  name: string,
  column: T | undefined,
  n: number,
): column is T {
  if (column === undefined) {
    issues.push({
      code: "missing_column",
      message: `MetricAccumulator.add: expected a ${name} column (the accumulator groups by it), found none`,
    });
    return false;
  }
  if (column.length !== n) {
    issues.push({
      code: "length_mismatch",
      message: `MetricAccumulator.add: ${name} expected ${n} entries (one per prediction), found ${column.length}`,
    });
    return false;
  }
  return true;
}
