import { mkdtemp, readFile, readdir, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import { summarizeOutcome } from "../../trainer/metrics/summarize-outcome.js";
import { renderReport } from "../../trainer/report/render-report.js";
import type { ReportInput } from "../../trainer/report/report-input.js";
import { writeReport } from "../../trainer/report/write-report.js";
import { chartMarks } from "./chart-marks.js";
import {
  HOSTILE_FEATURE,
  HOSTILE_SEGMENT,
  plotlineReportInput,
} from "./plotline-report-fixture.js";

const SECTIONS = [
  "findings",
  "heads",
  "freshness",
  "staleness",
  "importance",
  "pruning",
  "latency",
];

let input: ReportInput;
let html: string;
let warnings: unknown[][];

beforeAll(async () => {
  input = plotlineReportInput();
  // Vega and Vega-Lite report spec problems (a dropped channel, a bad scale) as warnings.
  const warn = vi.spyOn(console, "warn").mockImplementation(() => undefined);
  try {
    html = await renderReport(input);
    warnings = warn.mock.calls;
  } finally {
    warn.mockRestore();
  }
});

/** Every start tag of the page (escaped text holds no "<", so these are real tags). */
function startTags(page: string): string[] {
  return page.match(/<[a-zA-Z][^>]*>/g) ?? [];
}

describe("renderReport", () => {
  it("draws every chart without a Vega warning", () => {
    expect(warnings).toEqual([]);
  });

  it("holds no external reference, script or URL", () => {
    expect(html).not.toMatch(/https?:\/\//i);
    expect(html).not.toMatch(/@import/i);
    expect(html).not.toMatch(/url\((?!#)/i);
    const tags = startTags(html);
    expect(tags.length).toBeGreaterThan(1000);
    for (const tag of tags) {
      expect(tag).not.toMatch(/^<(script|link|img|iframe|object|embed|image|use|foreignObject)\b/i);
      expect(tag).not.toMatch(/\ssrc\s*=/i);
      expect(tag).not.toMatch(/\son\w+\s*=/i);
      // Only in-page anchors (the section navigation, clip-path references).
      for (const [, target] of tag.matchAll(/\shref="([^"]*)"/g)) expect(target).toMatch(/^#/);
    }
  });

  it("shows user text as text", () => {
    expect(html).not.toContain(HOSTILE_SEGMENT);
    expect(html).not.toContain(HOSTILE_FEATURE);
    expect(html).toContain(
      "&lt;script&gt;console.error(&quot;injected segment&quot;)&lt;/script&gt;",
    );
    expect(html).toContain(
      "&lt;img src=x onerror=&quot;console.error(&#39;injected feature&#39;)&quot;&gt;",
    );
  });

  it("escapes user text inside the charts too", async () => {
    const evil = `<script>alert("x")</script>`;
    const page = await renderReport({
      title: `${evil} & co`,
      findings: [evil],
      details: [{ name: evil, value: evil }],
      heads: [
        {
          outcome: evil,
          overall: input.heads![0].overall,
          reliability: input.heads![0].reliability,
        },
      ],
      importance: [{ forest: evil, features: [{ feature: evil, gain: 3, cover: 2, splits: 1 }] }],
      staleness: {
        windows: [evil, "w2"],
        forests: [
          {
            forest: evil,
            perWindow: [
              { perTree: [0.01], forest: 0.01 },
              { perTree: [0.3], forest: 0.3 },
            ],
          },
        ],
        verdict: { refit: true, reason: evil },
      },
      latency: { description: evil, perItem: { p50: 1, p90: 2, p99: 3, p999: 4, max: 5 } },
    });
    expect(page).not.toContain(evil);
    expect(startTags(page).filter((t) => /^<script/i.test(t))).toEqual([]);
    // Vega writes the names into axis labels, titles and aria-labels: all escaped.
    const svgText = chartMarks(page)
      .map((c) => c.svg)
      .join("");
    expect(svgText).toContain("&lt;script&gt;");
  });

  it("draws the marks each chart's data calls for", () => {
    const charts = chartMarks(html);
    const byId = new Map(charts.map((c) => [c.id, c]));
    const heads = input.heads!;
    // Reliability: one point per bin with rows, the diagonal, and a line from two bins on.
    heads.forEach((head, i) => {
      const chart = byId.get(`chart-reliability-${i}`)!;
      const bins = Array.from(head.reliability!.count).filter((n) => n > 0).length;
      expect(chart.marks).toEqual(
        bins >= 2 ? { rule: 1, line: 1, symbol: bins } : { rule: 1, symbol: 1 },
      );
    });
    // Freshness: per outcome two panels of three arm lines, a point per window, and
    // the calibration reference.
    const fresh = input.freshness!;
    const outcomes = new Set(fresh.figures.map((f) => f.outcome)).size;
    expect(byId.get("chart-freshness")!.marks).toEqual({
      line: outcomes * 2 * 3,
      symbol: fresh.figures.length * 2,
      rule: outcomes,
    });
    // Forest PSI: a line per forest, the 0.10 / 0.25 / threshold lines and their labels.
    const stale = input.staleness!;
    expect(byId.get("chart-forest-psi")!.marks).toEqual({
      rule: 3,
      text: 3,
      line: stale.forests.length,
      symbol: stale.forests.length * stale.windows.length,
    });
    stale.forests.forEach((series, i) => {
      const cells = series.perWindow[0].perTree.length * stale.windows.length;
      expect(byId.get(`chart-tree-psi-${i}`)!.marks).toEqual({ rect: cells });
    });
    // Importance: three bars (gain, cover, splits) per used feature.
    input.importance!.forEach((forest, i) => {
      const used = forest.features.filter((f) => f.splits > 0).length;
      expect(byId.get(`chart-importance-${i}`)!.marks).toEqual({ rect: 3 * used });
    });
    const steps = input.pruning!.steps;
    expect(byId.get("chart-pruning")!.marks).toEqual({ line: 2, symbol: steps.length * 2 });
    const batches = input.latency!.batches!.length;
    expect(byId.get("chart-latency")!.marks).toEqual({ rect: 5 + batches, text: 5 + batches });
    expect(charts.length).toBe(heads.length + 1 + 1 + stale.forests.length + 2 + 1 + 1);
  });

  it("gives every SVG definition an id unique in the page", () => {
    const ids = [...html.matchAll(/\sid="([^"]+)"/g)].map((m) => m[1]);
    expect(new Set(ids).size).toBe(ids.length);
    for (const [, ref] of html.matchAll(/url\(#([^)]+)\)/g)) expect(ids).toContain(ref);
  });

  it("gives the same bytes for the same input", async () => {
    await renderReport({ latency: input.latency }); // moves Vega's id counters on
    expect(await renderReport(input)).toBe(html);
  });

  it("has every section, in order, with a navigation link each", () => {
    const order = SECTIONS.map((id) => html.indexOf(`<section id="${id}">`));
    expect(order.every((at) => at > 0)).toBe(true);
    expect([...order].sort((a, b) => a - b)).toEqual(order);
    for (const id of SECTIONS) expect(html).toContain(`<a href="#${id}">`);
  });
});

describe("renderReport with parts of the data", () => {
  it("leaves out every section without data", async () => {
    const full = input as unknown as Record<string, unknown>;
    for (const only of SECTIONS) {
      const page = await renderReport({ [only]: full[only] });
      for (const id of SECTIONS) {
        expect(page.includes(`<section id="${id}">`), `${only} alone, section ${id}`).toBe(
          id === only,
        );
        expect(page.includes(`href="#${id}"`)).toBe(id === only);
      }
    }
  });

  it("renders an empty input as a page that says so", async () => {
    const page = await renderReport({});
    expect(page).toContain("No data was given for any section.");
    expect(page).toContain("<title>Leafcast report</title>");
    expect(page).not.toContain("<svg");
    expect(page).not.toContain("<nav");
  });

  it("shows a head without reliability bins as a table only", async () => {
    const summary = summarizeOutcome(Float64Array.of(0.1, 0.9), Uint8Array.of(0, 1), 0.5);
    const page = await renderReport({ heads: [{ outcome: "reply", overall: summary }] });
    expect(page).not.toContain("<svg");
    expect(page).not.toContain("<h3>Reliability</h3>");
    expect(page).toContain(
      '<tr class="model"><th scope="row">model, all rows</th><td>2</td><td>1</td><td>50.00 %</td>',
    );
    expect(page).not.toContain("baseline:");
    expect(page).not.toContain("model by");
  });

  it("shows a metric that cannot be computed as n/a", async () => {
    // One class only: AUC is NaN by definition (OutcomeSummary doc), calibration divides by 0.
    const summary = summarizeOutcome(Float64Array.of(0.1, 0.2), Uint8Array.of(0, 0), 0.5);
    const page = await renderReport({ heads: [{ outcome: "hide", overall: summary }] });
    expect(page).toContain("<td>n/a</td>");
    expect(page).not.toMatch(/NaN|Infinity/);
  });

  it("draws the latency percentiles without batches", async () => {
    const page = await renderReport({ latency: { perItem: input.latency!.perItem } });
    const [chart] = chartMarks(page);
    expect(chart.marks).toEqual({ rect: 5, text: 5 });
    expect(page).not.toContain("batch of");
  });
});

describe("checkReportInput through renderReport", () => {
  async function codes(bad: ReportInput): Promise<string[]> {
    try {
      await renderReport(bad);
    } catch (error) {
      expect(error).toBeInstanceOf(LeafcastError);
      return (error as LeafcastError).issues.map((i) => i.code);
    }
    throw new Error("expected renderReport to throw");
  }

  it("gathers every problem before throwing", async () => {
    const found = await codes({
      freshness: {
        windows: ["05-06", "05-06"],
        figures: [
          { outcome: "reply", arm: "frozen", window: 2, ne: 0.9, calibration: 1 },
          { outcome: "reply", arm: "stale" as "frozen", window: 0, ne: 0.9, calibration: 1 },
        ],
      },
      staleness: {
        windows: ["w1", "w2"],
        forests: [{ forest: "reply", perWindow: [{ perTree: [0.1, 0.2], forest: 0.15 }] }],
        threshold: -1,
      },
      latency: { perItem: { p50: 900, p90: 800, p99: 1000, p999: 1100, max: NaN } },
    });
    expect(found).toEqual([
      "duplicate",
      "window_index",
      "freshness_arm",
      "threshold",
      "length_mismatch",
      "latency_order",
      "latency",
    ]);
  });

  it("names the problem, expected against found", async () => {
    await expect(
      renderReport({
        freshness: {
          windows: ["w1"],
          figures: [{ outcome: "reply", arm: "frozen", window: 3, ne: 0.9, calibration: 1 }],
        },
      }),
    ).rejects.toThrow(
      "report: freshness figure 1 (reply, frozen) expected a window index in [0, 1), found 3",
    );
  });
});

describe("writeReport", () => {
  let dir: string;
  beforeAll(async () => {
    dir = await mkdtemp(join(tmpdir(), "leafcast-report-"));
  });
  afterAll(async () => {
    await rm(dir, { recursive: true, force: true });
  });

  it("writes the rendered page and leaves no temporary file", async () => {
    const path = join(dir, "report.html");
    const small: ReportInput = { title: "Plotline µ-report", heads: input.heads!.slice(0, 1) };
    const bytes = await writeReport(path, small);
    const written = await readFile(path, "utf8");
    expect(written).toBe(await renderReport(small));
    expect(bytes).toBe(Buffer.byteLength(written, "utf8"));
    expect(await readdir(dir)).toEqual(["report.html"]);
  });
});
