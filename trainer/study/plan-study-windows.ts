import { LeafcastError, type Issue } from "../errors.js";
import { spanLabel } from "./span-label.js";

/** A run of consecutive day files scored as one unit of the study. */
export interface StudyWindow {
  /** For charts and sentences: "day 8" or "days 8-14" (1-based file numbers). */
  readonly label: string;
  readonly files: readonly string[];
  /** 1-based numbers of its first and last file in the whole list. */
  readonly firstDay: number;
  readonly lastDay: number;
  /** The trailing files the refit arm fits its trees and heads on before scoring this window. */
  readonly refitFiles: readonly string[];
}

/** How the day files are cut into the fit span and the scored windows. */
export interface StudyPlan {
  /** The first `fitDays` files: the frozen trees and the first heads learn on them. */
  readonly fitFiles: readonly string[];
  readonly fitLabel: string;
  readonly windows: readonly StudyWindow[];
}

/** The knobs of the cut, all counted in day files. */
export interface StudyPlanOptions {
  /** Day files per scored window (the last window may be shorter). */
  readonly windowDays: number;
  /** Day files the frozen trees and first heads are fit on. */
  readonly fitDays: number;
  /**
   * Trailing day files the refit arm learns on before each window, or "all" (the
   * default) for every file before it. With "all" the refit arm's heads start each
   * window having learned exactly the rows the updated heads have seen, in the same
   * order, so on a window's first day the two arms differ only in their trees (on
   * later days the updated heads have also learned the window's earlier days); a
   * fixed span costs less as the study grows longer.
   */
  readonly refitDays?: number | "all";
}

/**
 * Cuts a time-ordered list of day files into the fit span (the first `fitDays`
 * files) and the scored windows after it (`windowDays` files each; a shorter last
 * window keeps every file in the study). Each window also gets the files the
 * refit arm learns on: the `refitDays` files just before it, or every file before
 * it; only data from before the window, so no arm peeks.
 *
 * @example
 * planStudyWindows(days, { windowDays: 7, fitDays: 7 }).windows[0].label; // "days 8-14"
 */
export function planStudyWindows(files: readonly string[], options: StudyPlanOptions): StudyPlan {
  const { windowDays, fitDays } = options;
  const refitDays = options.refitDays ?? "all";
  const issues: Issue[] = [];
  const whole = (name: string, value: number): void => {
    if (!(Number.isSafeInteger(value) && value >= 1))
      issues.push({
        code: "bad_option",
        message: `${name} expected a whole number >= 1, found ${value}`,
      });
  };
  whole("window days", windowDays);
  whole("fit days", fitDays);
  if (refitDays !== "all") whole("refit days", refitDays);
  if (issues.length === 0 && fitDays >= files.length) {
    issues.push({
      code: "no_window",
      message: `expected more day files than the ${fitDays} fit days, so that at least one window is scored, found ${files.length}`,
    });
  }
  if (issues.length > 0) throw new LeafcastError("study", issues);

  const windows: StudyWindow[] = [];
  for (let start = fitDays; start < files.length; start += windowDays) {
    const end = Math.min(files.length, start + windowDays);
    windows.push({
      label: spanLabel(start + 1, end),
      files: files.slice(start, end),
      firstDay: start + 1,
      lastDay: end,
      refitFiles: files.slice(refitDays === "all" ? 0 : Math.max(0, start - refitDays), start),
    });
  }
  return { fitFiles: files.slice(0, fitDays), fitLabel: spanLabel(1, fitDays), windows };
}
