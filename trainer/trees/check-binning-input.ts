import { LeafcastError, type Issue } from "../errors.js";
import type { BinningOptions } from "./bin-features.js";
import type { TreeInput } from "./binned-features.js";

/**
 * Checks binFeatures' arguments: column lengths, finite numbers (NaN is
 * missing), category codes inside their dictionary, and the options' ranges.
 * Throws one LeafcastError listing every problem.
 *
 * @example
 * checkBinningInput(input, { bins: 255, binSampleRows: 200_000, maxCategories: 32, seed: 1 });
 */
export function checkBinningInput(input: TreeInput, options: BinningOptions): void {
  const issues: Issue[] = [];
  const n = input.rowCount;
  if (!Number.isInteger(n) || n < 0) {
    issues.push({ code: "bad_row_count", message: `expected a row count >= 0, found ${n}` });
  }
  if (!Number.isInteger(options.bins) || options.bins < 2 || options.bins > 255) {
    issues.push({
      code: "bad_bins",
      message: `bins: expected an integer in 2..255, found ${options.bins}`,
    });
  }
  if (!Number.isInteger(options.binSampleRows) || options.binSampleRows < 1) {
    issues.push({
      code: "bad_bin_sample",
      message: `binSampleRows: expected an integer >= 1, found ${options.binSampleRows}`,
    });
  }
  if (
    !Number.isInteger(options.maxCategories) ||
    options.maxCategories < 1 ||
    options.maxCategories > 254
  ) {
    issues.push({
      code: "bad_max_categories",
      message: `maxCategories: expected an integer in 1..254, found ${options.maxCategories}`,
    });
  }
  for (const column of input.numeric) {
    if (column.values.length !== n) {
      issues.push({
        code: "length_mismatch",
        message: `column "${column.name}" expected ${n} values, found ${column.values.length}`,
        column: column.name,
      });
      continue;
    }
    // The data readers refuse infinities too; finite values keep every edge a JSON number.
    const values = column.values;
    for (let r = 0; r < n; r++) {
      const x = values[r];
      if (x - x !== 0 && x === x) {
        issues.push({
          code: "not_finite",
          message: `column "${column.name}" expected a finite number or NaN (missing), found ${x} at row ${r + 1}`,
          column: column.name,
          row: r + 1,
        });
        break;
      }
    }
  }
  for (const column of input.categorical) {
    if (column.codes.length !== n) {
      issues.push({
        code: "length_mismatch",
        message: `column "${column.name}" expected ${n} codes, found ${column.codes.length}`,
        column: column.name,
      });
      continue;
    }
    const size = column.dictionary.length;
    for (let r = 0; r < n; r++) {
      const code = column.codes[r];
      if (code < -1 || code >= size) {
        issues.push({
          code: "bad_category_code",
          message: `column "${column.name}" expected codes in -1..${size - 1}, found ${code} at row ${r + 1}`,
          column: column.name,
        });
        break;
      }
    }
  }
  if (issues.length > 0) throw new LeafcastError("trees", issues);
}
