import { describe, expect, it } from "vitest";
import { summarizeOutcome } from "../../trainer/metrics/summarize-outcome.js";
import { recoveryShares } from "../../trainer/report/recovery-shares.js";
import type { ReportInput } from "../../trainer/report/report-input.js";
import { summarizeReport } from "../../trainer/report/summarize-report.js";
import { HOSTILE_FEATURE, plotlineReportInput } from "./plotline-report-fixture.js";

describe("summarizeReport", () => {
  const input = plotlineReportInput();
  const text = summarizeReport(input);
  const lines = text.split("\n");

  it("lists the findings and one line per head", () => {
    expect(lines[0]).toBe("Plotline engagement: May replay");
    expect(lines).toContain("Findings:");
    expect(lines).toContain("  - Head updates recover most of the NE lost to the base-rate drift.");
    for (const head of input.heads!) {
      const line = lines.find((l) => l.startsWith(`  ${head.outcome} `))!;
      expect(line).toBeDefined();
      // Figures to four decimals, as the table shows them.
      expect(line).toContain(head.overall.ne.toFixed(4));
      expect(line).toContain(head.overall.calibration.toFixed(4));
      expect(line).toContain(head.overall.auc.toFixed(4));
    }
  });

  it("says what head updates recover, the staleness verdict, unused features, pruning and latency", () => {
    expect(text).toMatch(
      / {2}open: head updates recover \d+\.\d\d %, \d+\.\d\d % is left to the trees/,
    );
    expect(lines).toContain(`Staleness: ${input.staleness!.verdict!.reason}`);
    // post_type, viewer_tenure_days and the hostile name are split on by neither forest.
    expect(lines).toContain(
      `Features: 3 of 12 unused by every forest: post_type, viewer_tenure_days, ${HOSTILE_FEATURE}`,
    );
    expect(lines).toContain(
      "Pruning: 12 -> 4 features, held-out NE reply 0.9020 -> 0.9420, save 0.9150 -> 0.9350",
    );
    expect(lines).toContain("  reduced schema: runs/may/schema-pruned.json");
    expect(text).toContain(
      "Latency: one item p50 820 ns, p90 960 ns, p99 2.10 µs, p99.9 9.40 µs, max 61.0 µs; batch of 1: 790 ns per item",
    );
  });

  it("is the same text for the same input", () => {
    expect(summarizeReport(plotlineReportInput())).toBe(text);
  });

  it("leaves out what is absent", () => {
    expect(summarizeReport({})).toBe("Leafcast report\n");
    const summary = summarizeOutcome(Float64Array.of(0.2, 0.7), Uint8Array.of(0, 1), 0.5);
    const only = summarizeReport({ heads: [{ outcome: "reply", overall: summary }] });
    expect(only).not.toMatch(/Findings|Freshness|Staleness|Features|Pruning|Latency/);
  });

  it("reads the worst forest of the latest window when no verdict is given", () => {
    const text = summarizeReport({
      staleness: {
        windows: ["w1", "w2"],
        forests: [
          {
            forest: "open",
            perWindow: [
              { perTree: [0], forest: 0.01 },
              { perTree: [0.05], forest: 0.05 },
            ],
          },
          {
            forest: "reply",
            perWindow: [
              { perTree: [0], forest: 0.02 },
              { perTree: [0.3], forest: 0.3 },
            ],
          },
        ],
      },
    });
    // 0.3 is above 0.25: a significant shift in the usual reading (Yurdakul 2018, check-values.md).
    expect(text).toContain(
      "Staleness: largest forest leaf PSI in w2 is 0.300 (significant), forest reply",
    );
  });

  it("keeps terminal control sequences out of the output", () => {
    const input: ReportInput = { title: "Plot\u001b[2Jline", findings: ["two\nlines\u0007"] };
    const text = summarizeReport(input);
    // eslint-disable-next-line no-control-regex
    expect(text).not.toMatch(/[\u0000-\u0009\u000b-\u001f\u007f]/);
    expect(text).toContain("Plot?[2Jline");
    expect(text).toContain("  - two lines?");
  });
});

describe("recoveryShares", () => {
  it("splits the NE lost to drift between head updates and the trees", () => {
    // Hand case: lost = 0.95 - 0.90 = 0.05; heads win back 0.95 - 0.91 = 0.04 of it.
    const shares = recoveryShares({
      outcome: "reply",
      frozenNe: 0.95,
      headsUpdatedNe: 0.91,
      treesRefitNe: 0.9,
    })!;
    expect(shares.lost).toBeCloseTo(0.05, 12);
    expect(shares.recovered).toBeCloseTo(0.8, 12);
    expect(shares.leftToTrees).toBeCloseTo(0.2, 12);
  });

  it("has nothing to split when drift cost nothing", () => {
    expect(
      recoveryShares({ outcome: "hide", frozenNe: 0.9, headsUpdatedNe: 0.9, treesRefitNe: 0.9 }),
    ).toBeNull();
    expect(
      recoveryShares({ outcome: "hide", frozenNe: NaN, headsUpdatedNe: 0.9, treesRefitNe: 0.9 }),
    ).toBeNull();
  });
});
