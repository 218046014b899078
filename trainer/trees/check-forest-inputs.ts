import { LeafcastError, type Issue } from "../errors.js";
import type { BinnedFeatures } from "./binned-features.js";
import type { FitForestsOptions, ForestTarget } from "./fit-forests.js";

/**
 * Checks fitForests' arguments and throws one LeafcastError listing every problem.
 *
 * @example
 * checkForestInputs(binned, [{ outcome: "open", label }], { settings, seed: 1, workers: 2 });
 */
export function checkForestInputs(
  binned: BinnedFeatures,
  targets: readonly ForestTarget[],
  options: FitForestsOptions,
): void {
  const issues: Issue[] = [];
  const s = options.settings;
  const n = binned.rowCount;
  const expect = (ok: boolean, field: string, wanted: string, found: unknown): void => {
    if (!ok) {
      issues.push({
        code: "bad_setting",
        message: `${field}: expected ${wanted}, found ${String(found)}`,
      });
    }
  };
  const integer = (x: number, lo: number, hi: number): boolean =>
    Number.isInteger(x) && x >= lo && x <= hi;
  expect(integer(s.count, 1, 1e6), "trees.count", "an integer >= 1", s.count);
  expect(integer(s.depth, 1, 16), "trees.depth", "an integer in 1..16", s.depth);
  expect(integer(s.leaves, 2, 65536), "trees.leaves", "an integer in 2..65536", s.leaves);
  expect(
    s.learningRate > 0 && s.learningRate <= 1,
    "trees.learningRate",
    "a number in (0, 1]",
    s.learningRate,
  );
  expect(s.l2 >= 0, "trees.l2", "a number >= 0", s.l2);
  expect(s.minLeafHessian >= 0, "trees.minLeafHessian", "a number >= 0", s.minLeafHessian);
  expect(s.minSplitGain >= 0, "trees.minSplitGain", "a number >= 0", s.minSplitGain);
  expect(
    s.rowFraction > 0 && s.rowFraction <= 1,
    "trees.rowFraction",
    "a number in (0, 1]",
    s.rowFraction,
  );
  expect(
    s.featureFraction > 0 && s.featureFraction <= 1,
    "trees.featureFraction",
    "a number in (0, 1]",
    s.featureFraction,
  );
  expect(
    s.validationFraction >= 0 && s.validationFraction < 1,
    "trees.validationFraction",
    "a number in [0, 1)",
    s.validationFraction,
  );
  expect(
    integer(s.patience, 0, Number.MAX_SAFE_INTEGER),
    "trees.patience",
    "an integer >= 0",
    s.patience,
  );
  expect(integer(options.workers, 1, 256), "workers", "an integer in 1..256", options.workers);
  expect(integer(options.seed, 0, 4294967295), "seed", "an integer in 0..4294967295", options.seed);
  if (options.blockRows !== undefined) {
    expect(
      integer(options.blockRows, 1, 2 ** 30),
      "blockRows",
      "an integer >= 1",
      options.blockRows,
    );
  }
  if (n < 2) {
    issues.push({
      code: "too_few_rows",
      message: `expected at least 2 rows to fit trees, found ${n}`,
    });
  }
  if (targets.length === 0) {
    issues.push({
      code: "no_outcome",
      message: "expected at least one outcome to fit a forest for, found none",
    });
  }
  const seen = new Set<string>();
  for (const target of targets) {
    if (seen.has(target.outcome)) {
      issues.push({
        code: "duplicate_outcome",
        message: `outcome "${target.outcome}" is listed twice`,
        column: target.outcome,
      });
    }
    seen.add(target.outcome);
    if (target.label.length !== n) {
      issues.push({
        code: "length_mismatch",
        message: `outcome "${target.outcome}" expected ${n} labels, found ${target.label.length}`,
        column: target.outcome,
      });
      continue;
    }
    const bad = target.label.findIndex((y) => y > 1);
    if (bad >= 0) {
      issues.push({
        code: "bad_label",
        message: `outcome "${target.outcome}" expected labels 0 or 1, found ${target.label[bad]} at row ${bad + 1}`,
        column: target.outcome,
        row: bad + 1,
      });
    }
  }
  const weight = options.weight ?? null;
  if (weight !== null) {
    if (weight.length !== n) {
      issues.push({
        code: "length_mismatch",
        message: `weights: expected ${n} values, found ${weight.length}`,
      });
    } else {
      const bad = weight.findIndex((w) => !(w >= 0 && w < Infinity));
      if (bad >= 0) {
        issues.push({
          code: "bad_weight",
          message: `weights: expected finite numbers >= 0, found ${weight[bad]} at row ${bad + 1}`,
          row: bad + 1,
        });
      } else if (!weight.some((w) => w > 0)) {
        issues.push({
          code: "bad_weight",
          message: "weights: expected some weight above 0, found all 0",
        });
      }
    }
  }
  const timestamp = options.timestamp ?? null;
  if (timestamp !== null && timestamp.length !== n) {
    issues.push({
      code: "length_mismatch",
      message: `timestamps: expected ${n} values, found ${timestamp.length}`,
    });
  }
  if (issues.length > 0) throw new LeafcastError("trees", issues);
}
