import { LeafcastError, type Issue } from "../errors.js";

/** How many offending entries of one kind are quoted before the rest are only counted. */
const QUOTED = 3;

/**
 * Checks the arrays a metric reads: equal lengths, at least one row, predictions in
 * [0, 1], labels 0 or 1, weights finite and non-negative with a positive total.
 * Gathers every problem and throws one LeafcastError (source "metrics"). A streaming
 * batch passes `wholeData = false`: it may be empty or weigh nothing, since the
 * figures are taken over all batches.
 *
 * @example
 * checkMetricInputs("logLoss", new Float64Array([0.2]), new Uint8Array([1])); // passes
 * checkMetricInputs("logLoss", new Float64Array([NaN]), new Uint8Array([1]));
 * // throws: metrics: logLoss: prediction expected a probability in [0, 1], found NaN (index 0)
 */
export function checkMetricInputs(
  op: string,
  predicted: Float64Array,
  label: Uint8Array,
  weight?: Float64Array,
  wholeData = true,
): void {
  const issues: Issue[] = [];
  const n = predicted.length;
  if (label.length !== n) {
    issues.push({
      code: "length_mismatch",
      message: `${op}: labels expected ${n} entries (one per prediction), found ${label.length}`,
    });
  }
  if (weight !== undefined && weight.length !== n) {
    issues.push({
      code: "length_mismatch",
      message: `${op}: weights expected ${n} entries (one per prediction), found ${weight.length}`,
    });
  }
  if (n === 0 && wholeData) {
    issues.push({ code: "empty", message: `${op}: expected at least one row, found 0` });
  }
  if (issues.length > 0) throw new LeafcastError("metrics", issues);

  scan(issues, op, "prediction", "not_a_probability", "a probability in [0, 1]", n, (i) =>
    predicted[i] >= 0 && predicted[i] <= 1 ? undefined : predicted[i],
  );
  scan(issues, op, "label", "not_a_label", "0 or 1", n, (i) =>
    label[i] <= 1 ? undefined : label[i],
  );
  if (weight !== undefined) {
    let total = 0;
    scan(issues, op, "weight", "bad_weight", "a finite number >= 0", n, (i) => {
      const v = weight[i];
      if (v >= 0 && v < Infinity) {
        total += v;
        return undefined;
      }
      return v;
    });
    if (issues.length === 0 && wholeData && !(total > 0)) {
      issues.push({
        code: "zero_weight",
        message: `${op}: weights expected a positive total, found ${total}`,
      });
    }
  }
  if (issues.length > 0) throw new LeafcastError("metrics", issues);
}

/** Appends an issue per bad entry (the first few quoted, the rest counted). */
function scan(
  issues: Issue[],
  op: string,
  what: string,
  code: string,
  expected: string,
  n: number,
  badValue: (i: number) => number | undefined,
): void {
  let bad = 0;
  for (let i = 0; i < n; i++) {
    const v = badValue(i);
    if (v === undefined) continue;
    if (bad < QUOTED) {
      issues.push({
        code,
        message: `${op}: ${what} expected ${expected}, found ${v} (index ${i})`,
      });
    }
    bad++;
  }
  if (bad > QUOTED) {
    issues.push({ code, message: `${op}: ${bad - QUOTED} more ${what}s outside ${expected}` });
  }
}
