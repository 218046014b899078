import { describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import { planStudyWindows } from "../../trainer/study/plan-study-windows.js";

// Hand-made cases: the expected windows are worked out by hand from the rule the
// function states (consecutive day files per window, fit days first); no outside source.

const days = Array.from({ length: 10 }, (_, i) => `day-${i + 1}.csv`);

describe("planStudyWindows", () => {
  it("fits on the first days and scores the rest in windows, the last one shorter", () => {
    const plan = planStudyWindows(days, { fitDays: 3, windowDays: 3 });
    expect(plan.fitFiles).toEqual(days.slice(0, 3));
    expect(plan.fitLabel).toBe("days 1-3");
    expect(plan.windows.map((w) => [w.label, w.firstDay, w.lastDay])).toEqual([
      ["days 4-6", 4, 6],
      ["days 7-9", 7, 9],
      ["day 10", 10, 10],
    ]);
    expect(plan.windows[2].files).toEqual(["day-10.csv"]);
  });

  it("gives the refit arm only files from before each window", () => {
    const all = planStudyWindows(days, { fitDays: 2, windowDays: 4 });
    expect(all.windows.map((w) => w.refitFiles.length)).toEqual([2, 6]);
    const trailing = planStudyWindows(days, { fitDays: 2, windowDays: 4, refitDays: 3 });
    expect(trailing.windows[0].refitFiles).toEqual(["day-1.csv", "day-2.csv"]);
    expect(trailing.windows[1].refitFiles).toEqual(["day-4.csv", "day-5.csv", "day-6.csv"]);
    for (const plan of [all, trailing]) {
      for (const w of plan.windows) {
        for (const f of w.refitFiles) expect(w.files).not.toContain(f);
        expect(days.indexOf(w.refitFiles[w.refitFiles.length - 1])).toBe(w.firstDay - 2);
      }
    }
  });

  it("reports every bad option at once", () => {
    let caught: unknown;
    try {
      planStudyWindows(days, { fitDays: 0, windowDays: 1.5, refitDays: -1 });
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(LeafcastError);
    expect((caught as LeafcastError).issues.map((i) => i.message)).toEqual([
      "window days expected a whole number >= 1, found 1.5",
      "fit days expected a whole number >= 1, found 0",
      "refit days expected a whole number >= 1, found -1",
    ]);
    expect(() => planStudyWindows(days, { fitDays: 10, windowDays: 1 })).toThrow(
      "study: expected more day files than the 10 fit days, so that at least one window is scored, found 10",
    );
  });
});
