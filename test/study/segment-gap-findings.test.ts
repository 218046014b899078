import { describe, expect, it } from "vitest";
import type { FreshnessArm } from "../../trainer/report/report-input.js";
import { segmentGapFindings } from "../../trainer/study/segment-gap-findings.js";
import type { SegmentWindowFigure } from "../../trainer/study/window-figure.js";

// Hand-made figures; the expected means are worked out by hand (row-weighted
// averages of NE over the chosen windows); no outside source.
function figure(
  segment: string,
  outcome: string,
  arm: FreshnessArm,
  window: number,
  ne: number,
  rows: number,
): SegmentWindowFigure {
  return {
    segment,
    outcome,
    arm,
    window,
    ne,
    rows,
    calibration: 1,
    logLoss: ne,
    positiveRate: 0.1,
  };
}

describe("segmentGapFindings", () => {
  const figures = [
    // plot_tour, react: refit (1000 x 1.0 + 3000 x 1.2) / 4000 = 1.15 against
    // updated (1000 x 1.1 + 3000 x 1.3) / 4000 = 1.25: 8.0 % lower.
    figure("plot_tour", "react", "heads-updated", 3, 1.1, 1000),
    figure("plot_tour", "react", "trees-refit", 3, 1.0, 1000),
    figure("plot_tour", "react", "heads-updated", 4, 1.3, 3000),
    figure("plot_tour", "react", "trees-refit", 4, 1.2, 3000),
    figure("plot_tour", "react", "frozen", 4, 2.0, 3000),
    // harvest_photo, react: refit worse than updated heads: no finding.
    figure("harvest_photo", "react", "heads-updated", 4, 0.9, 9000),
    figure("harvest_photo", "react", "trees-refit", 4, 0.95, 9000),
    // swap_offer, open: a 10 % gap on too few rows: no finding.
    figure("swap_offer", "open", "heads-updated", 4, 1.0, 400),
    figure("swap_offer", "open", "trees-refit", 4, 0.9, 400),
    // A window before the drift is not averaged.
    figure("plot_tour", "react", "heads-updated", 1, 5.0, 1000),
    figure("plot_tour", "react", "trees-refit", 1, 0.1, 1000),
  ];

  it("names the segments where refitting beats the updated heads, widest gap first", () => {
    const lines = segmentGapFindings({
      segmentFigures: figures,
      segmentColumn: "post_type",
      windows: [3, 4],
      span: "days 22-42",
    });
    expect(lines).toEqual([
      "on post_type = plot_tour rows, refitting the trees beats the updated heads for react: " +
        "NE 1.1500 refit against 1.2500 heads updated (8.0 % lower, 4,000 rows, days 22-42): " +
        "a gap only refitting closes",
    ]);
  });

  it("finds nothing when no window is chosen", () => {
    expect(
      segmentGapFindings({
        segmentFigures: figures,
        segmentColumn: "post_type",
        windows: [],
        span: "no window",
      }),
    ).toEqual([]);
  });
});
