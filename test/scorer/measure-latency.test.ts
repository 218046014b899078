import { describe, expect, it } from "vitest";
import { createScorer } from "../../scorer/create-scorer.js";
import { measureLatency } from "../../scorer/measure-latency.js";
import { formatLatencyTable } from "../../trainer/artifact/format-latency-table.js";
import { latencyTable } from "../../trainer/artifact/latency-table.js";
import { syntheticItems } from "../../trainer/artifact/synthetic-items.js";
import { asScoringModel, smallModel } from "./fixtures.js";

// No assertion here is about speed (that is bench/score.ts's job): only the arithmetic and the shape.
describe("measureLatency", () => {
  const scorer = createScorer(asScoringModel(smallModel()));
  const items = syntheticItems(20, 6);

  it("turns clock readings into distributions, subtracting the clock's own cost", () => {
    // A fake clock that advances 1 microsecond per reading: every timed call spans one step,
    // exactly the cost of reading the clock, so every sample is 0 after the subtraction.
    let t = 0;
    const report = measureLatency(scorer, items, {
      warmup: 3,
      repetitions: 2,
      now: () => (t += 0.001),
    });
    expect(report.timer.overheadNs).toBeCloseTo(1000, 6);
    expect(report.timer.resolutionNs).toBeCloseTo(1000, 6);
    expect(report.single.total.samples).toBe(40);
    expect(report.single.total.p50).toBeCloseTo(0, 6);
    expect(report.single.total.max).toBeCloseTo(0, 6);
    // A batch of 20 items spans one step: 1000 ns / 20 items.
    expect(report.batch.nsPerItem).toBeCloseTo(50, 6);
  });

  it("reports ordered percentiles with the real clock", () => {
    const report = measureLatency(scorer, items, { warmup: 50, repetitions: 3 });
    const d = report.single.total;
    expect(d.p50).toBeLessThanOrEqual(d.p90);
    expect(d.p90).toBeLessThanOrEqual(d.p99);
    expect(d.p99).toBeLessThanOrEqual(d.p999);
    expect(d.p999).toBeLessThanOrEqual(d.max);
    expect(report.batch.nsPerItem).toBeGreaterThan(0);
    expect(report.batch.headsNsPerItem).toBeGreaterThanOrEqual(0);
    expect(() => measureLatency(scorer, [])).toThrow(/at least one item/);
  });

  it("builds and prints the latency table for generated artifacts", () => {
    const seen: number[] = [];
    const rows = latencyTable({
      trees: [8, 16],
      depths: [3],
      items: 30,
      warmup: 10,
      repetitions: 1,
      onRow: (row) => seen.push(row.trees),
    });
    expect(seen).toEqual([8, 16]);
    expect(rows.map((row) => [row.trees, row.depth, row.heads])).toEqual([
      [8, 3, 6],
      [16, 3, 6],
    ]);
    expect(rows[1].artifactBytes).toBeGreaterThan(rows[0].artifactBytes);
    const table = formatLatencyTable(rows);
    expect(table.split("\n")[0]).toMatch(/^trees\s+depth\s+heads\s+artifact\s+batch us\/item/);
    expect(table.split("\n").length).toBe(4);
  });
});
