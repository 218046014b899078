import { describe, expect, it } from "vitest";
import type { TopLevelSpec } from "vega-lite";
import { renderChart } from "../../trainer/report/render-chart.js";

// A continuous colour legend makes Vega emit a <linearGradient> with a counter-numbered id.
const spec: TopLevelSpec = {
  data: {
    values: [
      { feature: 'crop id="x"', gain: 3 },
      { feature: "tie_strength", gain: 7 },
    ],
  },
  mark: "bar",
  encoding: {
    y: { field: "feature", type: "nominal" },
    x: { field: "gain", type: "quantitative" },
    color: { field: "gain", type: "quantitative" },
  },
};

describe("renderChart", () => {
  it("renames definition ids under the chart id, the same on every call", async () => {
    const first = await renderChart(spec, "chart-a");
    const second = await renderChart(spec, "chart-a");
    expect(second).toBe(first);
    const ids = [...first.matchAll(/<[^>]* id="([^"]+)"/g)].map((m) => m[1]);
    expect(ids.length).toBeGreaterThan(0);
    for (const id of ids) expect(id).toMatch(/^chart-a-def\d+$/);
    for (const [, ref] of first.matchAll(/url\(#([^)]+)\)/g)) expect(ids).toContain(ref);
    // Another chart id gives other ids, so two charts on one page never collide.
    expect(await renderChart(spec, "chart-b")).toBe(first.replaceAll("chart-a-", "chart-b-"));
  });

  it("leaves label text alone and drops the namespace declarations", async () => {
    const svg = await renderChart(spec, "chart-a");
    expect(svg).toContain('>crop id="x"</text>');
    expect(svg).not.toContain("xmlns");
    expect(svg.startsWith("<svg ")).toBe(true);
  });
});
