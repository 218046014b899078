import { LeafcastError, type Issue } from "../errors.js";

/**
 * Shares below this floor are raised to it before the logarithm, so an empty bin
 * gives a large but finite term instead of infinity (common practice; shares are not
 * renormalized afterwards). A bin empty in both windows adds nothing.
 */
export const PSI_EPSILON = 1e-4;

/** Bin counts (or weights) of one distribution. */
export type BinCounts = Float64Array | Uint32Array;

/**
 * Population Stability Index of an actual distribution against an expected one, over
 * the same bins given as counts: PSI = sum_i (A_i - E_i) ln(A_i / E_i) with shares
 * A_i, E_i (each floored at PSI_EPSILON). Usual reading: below 0.10 stable, 0.10 to
 * 0.25 moderate, above 0.25 significant shift (see psiReading).
 *
 * @example
 * populationStabilityIndex(Float64Array.of(20, 30, 50), Float64Array.of(30, 30, 40));
 * // 0.1 * ln(1.5) + 0 + (-0.1) * ln(0.8) = 0.0628609...
 */
export function populationStabilityIndex(
  expected: BinCounts,
  actual: BinCounts,
  epsilon = PSI_EPSILON,
): number {
  const issues: Issue[] = [];
  if (actual.length !== expected.length) {
    issues.push({
      code: "length_mismatch",
      message: `populationStabilityIndex: actual counts expected ${expected.length} bins (as the expected counts), found ${actual.length}`,
    });
  }
  if (!(epsilon > 0 && epsilon < 1)) {
    issues.push({
      code: "bad_epsilon",
      message: `populationStabilityIndex: epsilon expected a number in (0, 1), found ${epsilon}`,
    });
  }
  checkCounts(issues, "expected", expected, 0, expected.length);
  checkCounts(issues, "actual", actual, 0, actual.length);
  if (issues.length > 0) throw new LeafcastError("metrics", issues);
  return psiKernel(expected, actual, 0, expected.length, epsilon);
}

/** PSI over bins [offset, offset + length) of two count arrays with positive totals. */
export function psiKernel(
  expected: BinCounts,
  actual: BinCounts,
  offset: number,
  length: number,
  epsilon: number,
): number {
  let expectedTotal = 0;
  let actualTotal = 0;
  for (let i = offset; i < offset + length; i++) {
    expectedTotal += expected[i];
    actualTotal += actual[i];
  }
  let psi = 0;
  for (let i = offset; i < offset + length; i++) {
    const e = Math.max(expected[i] / expectedTotal, epsilon);
    const a = Math.max(actual[i] / actualTotal, epsilon);
    psi += (a - e) * Math.log(a / e);
  }
  return psi;
}

/** Counts must be finite, non-negative, with a positive total over the range. */
export function checkCounts(
  issues: Issue[],
  what: string,
  counts: BinCounts,
  offset: number,
  length: number,
  where = "",
): void {
  let total = 0;
  for (let i = offset; i < offset + length; i++) {
    const c = counts[i];
    if (!(c >= 0 && c < Infinity)) {
      issues.push({
        code: "bad_count",
        message: `populationStabilityIndex: ${what} counts${where} expected finite numbers >= 0, found ${c} (bin ${i - offset})`,
      });
      return;
    }
    total += c;
  }
  if (!(total > 0)) {
    issues.push({
      code: "empty_distribution",
      message: `populationStabilityIndex: ${what} counts${where} expected a positive total, found ${total}`,
    });
  }
}
