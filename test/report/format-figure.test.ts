import { describe, expect, it } from "vitest";
import { escapeHtml } from "../../trainer/report/escape-html.js";
import { formatFigure } from "../../trainer/report/format-figure.js";
import { windowAxis } from "../../trainer/report/window-axis.js";

describe("formatFigure", () => {
  it("formats each kind without locale", () => {
    expect(formatFigure(1234567, "count")).toBe("1,234,567");
    expect(formatFigure(-1200, "count")).toBe("-1,200");
    expect(formatFigure(999, "count")).toBe("999");
    expect(formatFigure(0.03125, "percent")).toBe("3.13 %");
    expect(formatFigure(0.00005, "percent")).toBe("0.0050 %");
    expect(formatFigure(0.912345, "metric")).toBe("0.9123");
    expect(formatFigure(0.2304, "psi")).toBe("0.230");
  });

  it("scales nanoseconds to ns, µs and ms", () => {
    expect(formatFigure(4.26, "ns")).toBe("4.3 ns");
    expect(formatFigure(812, "ns")).toBe("812 ns");
    expect(formatFigure(1734, "ns")).toBe("1.73 µs");
    expect(formatFigure(61_000, "ns")).toBe("61.0 µs");
    expect(formatFigure(412_000, "ns")).toBe("412 µs");
    expect(formatFigure(2_500_000, "ns")).toBe("2.50 ms");
  });

  it("reads non-finite values as n/a", () => {
    for (const kind of ["count", "percent", "metric", "psi", "ns"] as const) {
      expect(formatFigure(NaN, kind)).toBe("n/a");
      expect(formatFigure(Infinity, kind)).toBe("n/a");
    }
  });
});

describe("escapeHtml", () => {
  it("escapes the five characters that matter in text and quoted attributes", () => {
    expect(escapeHtml(`<a href="x">Tom & Jerry's</a>`)).toBe(
      "&lt;a href=&quot;x&quot;&gt;Tom &amp; Jerry&#39;s&lt;/a&gt;",
    );
    expect(escapeHtml("tie_strength")).toBe("tie_strength");
  });
});

describe("windowAxis", () => {
  it("keeps labels upright when they fit and tilts them when they do not", () => {
    expect(windowAxis(["w1", "w2", "w3"], 300).labelAngle).toBe(0);
    // Eight dates in a 190 px panel (the freshness chart): 24 px a label, too narrow
    // upright, but tilted lines sit 15 px apart, more than a line of text.
    const days = Array.from({ length: 8 }, (_, d) => `2024-05-${String(d + 1).padStart(2, "0")}`);
    const tilted = windowAxis(days, 190);
    expect(tilted.labelAngle).toBe(-40);
    expect(tilted.labelOverlap).toBe(false);
    // Hundreds of windows: tilted labels would touch, so Vega may thin them.
    expect(
      windowAxis(
        Array.from({ length: 400 }, (_, d) => `d${d}`),
        200,
      ).labelOverlap,
    ).toBe(true);
  });
});
