import { parseNumberText } from "./parse-number-text.js";
import * as C from "./plan-columns.js";

/**
 * The words of cell problems: which code a number that a column refuses gets,
 * and what the column expected, so every format says the same thing.
 *
 * @example
 * numberProblem(CELL_WEIGHT, -1); // "negative_weight"
 * expectation("negative_weight", CELL_WEIGHT); // "expected a finite weight >= 0"
 */
export function numberProblem(cell: number, value: number): string {
  switch (cell) {
    case C.CELL_WEIGHT:
      return value - value === 0 ? "negative_weight" : "not_finite";
    case C.CELL_PROBABILITY:
      return value - value === 0 ? "out_of_range" : "not_finite";
    case C.CELL_LABEL:
      return "not_a_label";
    case C.CELL_TIME_ISO:
      return "wrong_type";
    default:
      return "not_finite";
  }
}

/** Label spellings taken as 0 and 1 besides numbers equal to 0 or 1. */
export const LABEL_WORDS: ReadonlyMap<string, number> = new Map([
  ["0", 0],
  ["1", 1],
  ["false", 0],
  ["true", 1],
  ["False", 0],
  ["True", 1],
  ["FALSE", 0],
  ["TRUE", 1],
]);

/** Missing markers that read as numbers ("-999"): typed sources compare numbers against them. */
export function numericMarkers(markers: ReadonlySet<string>): ReadonlySet<number> | null {
  const numbers = new Set<number>();
  for (const marker of markers) {
    const value = parseNumberText(marker);
    if (!Number.isNaN(value)) numbers.add(value);
  }
  return numbers.size > 0 ? numbers : null;
}

/** What a column of cell kind `cell` expected, for an issue of code `code`: the first half of a message. */
export function expectation(code: string, cell: number): string {
  switch (code) {
    case "missing_value":
      return cell === C.CELL_LABEL
        ? "expected 0 or 1 (a label cannot be missing)"
        : "expected a value (this column does not allow missing values)";
    case "not_finite":
      return "expected a finite number";
    case "negative_weight":
      return "expected a finite weight >= 0";
    case "out_of_range":
      return "expected a probability in [0, 1]";
    case "not_a_label":
      return "expected 0 or 1";
    case "invalid_utf8":
      return "expected UTF-8 text";
    case "bad_time":
      return cell === C.CELL_TIME_ISO
        ? "expected an ISO 8601 date or date-time"
        : "expected a valid time";
    case "wrong_type":
      if (cell === C.CELL_CATEGORY) return "expected text or a number";
      if (cell === C.CELL_LABEL) return "expected 0 or 1";
      if (cell === C.CELL_TIME_ISO) return "expected an ISO 8601 date or date-time";
      return "expected a number";
    default:
      return "expected a number";
  }
}
