/**
 * Opens the rendered report in headless Chromium (Debian's package, as .ci/run installs
 * it): every chart must be drawn with visible marks, nothing may be logged as an error,
 * no request may leave the file, and screenshots of the page and of each chart must not
 * be blank. Fails, never skips, when Chromium is missing.
 */
import { existsSync } from "node:fs";
import { mkdtemp, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { pathToFileURL } from "node:url";
import { chromium, type Browser, type Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { renderReport } from "../../trainer/report/render-report.js";
import type { ReportInput } from "../../trainer/report/report-input.js";
import { chartMarks, type ChartMarks } from "./chart-marks.js";
import { plotlineReportInput } from "./plotline-report-fixture.js";

const CHROMIUM = "/usr/bin/chromium";
const CHROMIUM_ARGS = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
];

/** What the page reports about one chart. */
interface DrawnChart {
  id: string;
  kind: string;
  width: number;
  height: number;
  /** Leaf elements inside role-mark groups, per mark kind. */
  marks: Record<string, number>;
  /** Of those, the ones with a non-empty box on screen. */
  visible: number;
}

/** Share of sampled pixels that differ from the corner colour, and distinct colours seen. */
interface PixelStats {
  inked: number;
  colours: number;
}

let browser: Browser;
let page: Page;
let input: ReportInput;
let expected: ChartMarks[];
let dir: string;
const problems: string[] = [];

beforeAll(async () => {
  if (!existsSync(CHROMIUM)) {
    throw new Error(
      `report browser test: expected Chromium at ${CHROMIUM}, found nothing; install Debian's "chromium" package (apt-get install chromium), as .ci/run does`,
    );
  }
  input = plotlineReportInput();
  const html = await renderReport(input);
  expected = chartMarks(html);
  dir = await mkdtemp(join(tmpdir(), "leafcast-report-browser-"));
  const file = join(dir, "report.html");
  await writeFile(file, html);

  browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
  page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
  page.on("console", (message) => {
    if (message.type() === "error" || message.type() === "warning")
      problems.push(`console ${message.type()}: ${message.text()}`);
  });
  page.on("pageerror", (error) => problems.push(`page error: ${error.message}`));
  page.on("request", (request) => {
    if (!request.url().startsWith("file:")) problems.push(`request: ${request.url()}`);
  });
  page.on("requestfailed", (request) => problems.push(`failed request: ${request.url()}`));
  await page.goto(pathToFileURL(file).href, { waitUntil: "load" });
});

afterAll(async () => {
  await browser?.close();
  // Set LEAFCAST_KEEP_SCREENSHOTS=1 to keep the page and its screenshot for a look.
  if (dir !== undefined && process.env.LEAFCAST_KEEP_SCREENSHOTS !== "1") {
    await rm(dir, { recursive: true, force: true });
  }
});

/** A box in page pixels (the screenshot is taken at device scale 1). */
interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

/**
 * Decodes a PNG in a blank page through a canvas (the only decoder at hand) and samples
 * the pixels of the whole image and of each box.
 */
async function pixelStats(png: Buffer, boxes: readonly Box[]): Promise<PixelStats[]> {
  const scratch = await browser.newPage();
  try {
    return await scratch.evaluate(
      async ({ base64, boxes }) => {
        const image = new Image();
        image.src = `data:image/png;base64,${base64}`;
        await image.decode();
        const canvas = document.createElement("canvas");
        canvas.width = image.width;
        canvas.height = image.height;
        const context = canvas.getContext("2d")!;
        context.drawImage(image, 0, 0);
        const whole = { x: 0, y: 0, width: image.width, height: image.height };
        return [whole, ...boxes].map((box) => {
          const { data } = context.getImageData(
            Math.round(box.x),
            Math.round(box.y),
            Math.max(1, Math.round(box.width)),
            Math.max(1, Math.round(box.height)),
          );
          const background = [data[0], data[1], data[2]];
          let inked = 0;
          let sampled = 0;
          const colours = new Set<number>();
          for (let i = 0; i < data.length; i += 4 * 3) {
            sampled++;
            const diff =
              Math.abs(data[i] - background[0]) +
              Math.abs(data[i + 1] - background[1]) +
              Math.abs(data[i + 2] - background[2]);
            if (diff > 24) inked++;
            colours.add((data[i] << 16) | (data[i + 1] << 8) | data[i + 2]);
          }
          return { inked: inked / sampled, colours: colours.size };
        });
      },
      { base64: png.toString("base64"), boxes },
    );
  } finally {
    await scratch.close();
  }
}

describe("the report in headless Chromium", () => {
  it("loads with no console error, page error or outside request", () => {
    expect(problems).toEqual([]);
  });

  it("draws every chart with visible marks, as many as in the file", async () => {
    const drawn: DrawnChart[] = await page.evaluate(() =>
      Array.from(document.querySelectorAll<HTMLElement>("figure.chart")).map((figure) => {
        const svg = figure.querySelector("svg");
        const box = svg?.getBoundingClientRect();
        const marks: Record<string, number> = {};
        let visible = 0;
        for (const group of Array.from(figure.querySelectorAll("g.role-mark"))) {
          const kind = Array.from(group.classList)
            .find((c) => c.startsWith("mark-"))!
            .slice(5);
          for (const child of Array.from(group.children)) {
            marks[kind] = (marks[kind] ?? 0) + 1;
            const r = child.getBoundingClientRect();
            if (r.width > 0 || r.height > 0) visible++;
          }
        }
        return {
          id: figure.id,
          kind: figure.dataset.chart ?? "",
          width: box?.width ?? 0,
          height: box?.height ?? 0,
          marks,
          visible,
        };
      }),
    );
    expect(drawn.map((c) => c.id)).toEqual(expected.map((c) => c.id));
    expect(new Set(drawn.map((c) => c.kind))).toEqual(
      new Set([
        "reliability",
        "freshness",
        "forest-psi",
        "tree-psi",
        "importance",
        "pruning",
        "latency",
      ]),
    );
    for (const [i, chart] of drawn.entries()) {
      expect(chart.width, chart.id).toBeGreaterThan(100);
      expect(chart.height, chart.id).toBeGreaterThan(100);
      // The browser's parse of the SVG finds the marks the Node-side count found.
      expect(chart.marks, chart.id).toEqual(expected[i].marks);
      const total = Object.values(chart.marks).reduce((a, b) => a + b, 0);
      expect(chart.visible, chart.id).toBe(total);
    }
  });

  it("turns no user text into elements", async () => {
    const count = await page.evaluate(
      () => document.querySelectorAll("script, img, iframe").length,
    );
    expect(count).toBe(0);
  });

  it("takes a screenshot that is not blank, nor blank where a chart is", async () => {
    const boxes: Box[] = await page.evaluate(() =>
      Array.from(document.querySelectorAll("figure.chart svg")).map((svg) => {
        const r = svg.getBoundingClientRect();
        return {
          x: r.left + window.scrollX,
          y: r.top + window.scrollY,
          width: r.width,
          height: r.height,
        };
      }),
    );
    const png = await page.screenshot({ path: join(dir, "report.png"), fullPage: true });
    const [page_, ...charts] = await pixelStats(png, boxes);
    expect(page_.inked).toBeGreaterThan(0.03);
    expect(page_.colours).toBeGreaterThan(50);
    expect(charts).toHaveLength(expected.length);
    charts.forEach((stats, i) => {
      // Charts are white with thin marks: a percent of ink and a few colours is plenty.
      expect(stats.inked, expected[i].id).toBeGreaterThan(0.01);
      expect(stats.colours, expected[i].id).toBeGreaterThan(4);
    });
  });
});
