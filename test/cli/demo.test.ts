import { existsSync, mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { loadScorer } from "../../scorer/index.js";
import { runDemo } from "../../trainer/demo/run-demo.js";

const dir = mkdtempSync(join(tmpdir(), "leafcast-demo-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("the end-to-end demo", () => {
  it("generates, fits, learns, updates, exports a loadable scorer and times it", async () => {
    const lines: string[] = [];
    const result = await runDemo({
      out: dir,
      days: 9,
      rowsPerDay: 1500,
      seed: 3,
      format: "csv",
      log: (line) => lines.push(line),
    });
    expect(result.dataFiles).toHaveLength(9);
    expect(result.rows).toBe(13_500);
    for (const path of [result.forestsPath, result.headsPath, result.artifactPath]) {
      expect(existsSync(path)).toBe(true);
    }
    const scorer = loadScorer(readFileSync(result.artifactPath, "utf8"));
    const scored = scorer.scoreOne({
      tie_strength: 0.4,
      post_type: "harvest_photo",
      feed_position: 3,
    });
    for (const p of Object.values(scored.probability)) expect(p > 0 && p < 1).toBe(true);
    const text = lines.join("\n");
    for (const step of [
      "1. scenario",
      "2. inspect",
      "3. fit-trees",
      "4. learn-heads",
      "5. update-heads",
      "6. export",
    ]) {
      expect(text).toContain(step);
    }
    expect(text).toMatch(/day 09 NE\/calibration: open \d/);
  });
});
