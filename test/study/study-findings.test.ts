import { describe, expect, it } from "vitest";
import type { FreshnessFigure, StalenessReport } from "../../trainer/report/report-input.js";
import { freshnessRecovery } from "../../trainer/study/freshness-recovery.js";
import { studyFindings } from "../../trainer/study/study-findings.js";

// Hand cases: recovered = (frozen - updated) / (frozen - refit), as the report defines it.
const figures: FreshnessFigure[] = [
  // open, windows 0 and 1: frozen 0.95 / 0.97, updated 0.91 / 0.93, refit 0.90 / 0.92
  ...[0, 1].flatMap((w): FreshnessFigure[] => [
    { outcome: "open", arm: "frozen", window: w, ne: 0.95 + 0.02 * w, calibration: 0.8 },
    { outcome: "open", arm: "heads-updated", window: w, ne: 0.91 + 0.02 * w, calibration: 1 },
    { outcome: "open", arm: "trees-refit", window: w, ne: 0.9 + 0.02 * w, calibration: 1 },
  ]),
  // reply: refitting loses, so nothing was lost to drift
  { outcome: "reply", arm: "frozen", window: 1, ne: 0.8, calibration: 1 },
  { outcome: "reply", arm: "heads-updated", window: 1, ne: 0.79, calibration: 1 },
  { outcome: "reply", arm: "trees-refit", window: 1, ne: 0.81, calibration: 1 },
];

const staleness = (psi: number[]): StalenessReport => ({
  windows: ["days 8-14", "days 15-21"],
  threshold: 0.25,
  forests: [{ forest: "open", perWindow: psi.map((p) => ({ perTree: [p], forest: p })) }],
});

describe("freshnessRecovery and studyFindings", () => {
  it("averages each arm over the chosen windows", () => {
    const [open] = freshnessRecovery(figures, ["open"], [0, 1]);
    expect(open.frozenNe).toBeCloseTo(0.96, 12);
    expect(open.headsUpdatedNe).toBeCloseTo(0.92, 12);
    expect(open.treesRefitNe).toBeCloseTo(0.91, 12);
    // reply lacks window 0: left out rather than averaged over fewer windows.
    expect(freshnessRecovery(figures, ["reply"], [0, 1])).toEqual([]);
  });

  it("says what head updates recover and when the trees went stale", () => {
    const recovery = freshnessRecovery(figures, ["open", "reply"], [1]);
    const lines = studyFindings({
      recovery,
      recoverySpan: "days 15-21",
      staleness: staleness([0.05, 0.31]),
    });
    expect(lines[0]).toBe(
      "head updates recover 80 % of the NE lost to drift for open; 20 % is left to the trees (NE lost 0.0500, days 15-21)",
    );
    expect(lines[1]).toContain("no NE lost to drift for reply over days 15-21");
    expect(lines[2]).toBe(
      "the trees went stale in days 15-21: forest open has leaf PSI 0.310 (significant shift), at or above the refit threshold 0.25; refit the trees",
    );
    expect(
      studyFindings({ recovery: [], recoverySpan: "x", staleness: staleness([0.05, 0.02]) }),
    ).toEqual([
      "the trees stayed below the refit threshold 0.25 in every window: the largest leaf PSI is 0.050 (stable), forest open in days 8-14",
    ]);
  });
});
