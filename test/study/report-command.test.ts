import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { writePlotlineDays } from "../../datasets/plotline/write-plotline-days.js";
import { runCliCaptured as run } from "../cli/run-cli-captured.js";

// Invented ground truth: a small Plotline run (the project's own generator) through
// the real command; the checks are on what the command must write and print.

const dir = mkdtempSync(join(tmpdir(), "leafcast-report-"));
const dataDir = join(dir, "data");
const configPath = join(dir, "config.json");
const schemaPath = "datasets/plotline.schema.json";

beforeAll(async () => {
  mkdirSync(dataDir);
  // Five small days; the new post type and the layout change fall inside the scored windows.
  await writePlotlineDays(dataDir, "csv", {
    seed: 2,
    days: 5,
    rowsPerDay: 1500,
    newPostTypeDay: 3,
    layoutChangeDay: 4,
    authors: 100,
    viewers: 800,
  });
  writeFileSync(
    configPath,
    JSON.stringify({
      workers: 1,
      trees: { count: 8, depth: 3, bins: 32, validationFraction: 0 },
      heads: { hashBits: 12 },
    }),
  );
}, 60_000);
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("leafcast report", () => {
  it("writes one self-contained HTML report and prints the summary", async () => {
    const html = join(dir, "report.html");
    const result = await run([
      "report",
      dataDir,
      "--schema",
      schemaPath,
      "--config",
      configPath,
      "--out",
      html,
      "--fit-days",
      "2",
      "--psi-threshold",
      "0.2",
      "--segment-by",
      "post_type",
    ]);
    expect(result.err).toContain("report: window day 3");
    expect(result.code, result.err).toBe(0);
    expect(existsSync(html)).toBe(true);
    const page = readFileSync(html, "utf8");
    for (const section of ["findings", "freshness", "staleness", "importance"]) {
      expect(page).toContain(`id="${section}"`);
    }
    for (const baseline of ["training positive rate", "trees only", "heads on hashed ids only"]) {
      expect(page).toContain(baseline);
    }
    expect(page).toContain("days 1-2");
    // Self-contained: nothing is fetched when the page opens.
    expect(page).not.toMatch(/<(script|link|img)[^>]+(src|href)=["']?https?:/i);
    for (const part of [
      "Findings:",
      "Freshness (NE lost to drift):",
      "Staleness: day 5:",
      "threshold 0.2",
      `wrote ${html}`,
    ]) {
      expect(result.out).toContain(part);
    }
  }, 120_000);

  it("refuses a fit span that leaves no window to score", async () => {
    const result = await run([
      "report",
      dataDir,
      "--schema",
      schemaPath,
      "--out",
      join(dir, "never.html"),
      "--fit-days",
      "5",
    ]);
    expect(result.code).toBe(2);
    expect(result.err).toContain(
      "study: expected more day files than the 5 fit days, so that at least one window is scored, found 5",
    );
    expect(existsSync(join(dir, "never.html"))).toBe(false);
  });

  it("refuses a PSI threshold that is not a positive number", async () => {
    const result = await run([
      "report",
      dataDir,
      "--schema",
      schemaPath,
      "--out",
      "x.html",
      "--psi-threshold",
      "0",
    ]);
    expect(result.code).toBe(1);
    expect(result.err).toContain('expected a positive number, found "0"');
  });
});
