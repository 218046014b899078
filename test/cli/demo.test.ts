import { existsSync, mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it, vi } from "vitest";
import { loadScorer } from "../../scorer/index.js";
import { runCli } from "../../trainer/cli/main.js";
import { runDemo } from "../../trainer/demo/run-demo.js";

const dir = mkdtempSync(join(tmpdir(), "leafcast-demo-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("the end-to-end demo", () => {
  it("generates, runs the freshness study, exports a loadable scorer, times it and writes the report", async () => {
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
    for (const path of [
      result.forestsPath,
      result.headsPath,
      result.artifactPath,
      result.reportPath,
    ]) {
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
      "3. fit-trees, learn-heads, update-heads",
      "4. export",
      "5. report",
    ]) {
      expect(text).toContain(step);
    }
    // Nine days: fit on days 1-7, one window of days 8-9 scored by the three arms.
    expect(text).toMatch(
      /window days 8-9: 3000 rows; NE frozen\/heads updated\/trees refit: open \d/,
    );
    expect(text).toContain("Findings:");
    const page = readFileSync(result.reportPath, "utf8");
    for (const section of ["heads", "freshness", "staleness", "importance", "latency"]) {
      expect(page).toContain(`id="${section}"`);
    }

    // The serving commands on the demo's outputs: export, describe, score a day's file.
    const artifact = join(dir, "cli-scorer.json");
    const scores = join(dir, "scores.csv");
    const quiet = vi.spyOn(process.stdout, "write").mockImplementation(() => true);
    try {
      const exported = await runCli([
        "export-scorer",
        "--trees",
        result.forestsPath,
        "--heads",
        result.headsPath,
        "--out",
        artifact,
        "--value",
        "hide=-20",
      ]);
      expect(exported).toBe(0);
      expect(await runCli(["describe-scorer", artifact, "--json"])).toBe(0);
      const scored = await runCli([
        "score",
        result.dataFiles[8],
        "--scorer",
        artifact,
        "--schema",
        "datasets/plotline.schema.json",
        "--out",
        scores,
      ]);
      expect(scored).toBe(0);
    } finally {
      quiet.mockRestore();
    }
    const lines2 = readFileSync(scores, "utf8").trim().split("\n");
    expect(lines2[0]).toBe("p_open,p_react,p_reply,p_save,p_reshare,p_hide,combined");
    expect(lines2).toHaveLength(1 + 1500);
    const [first] = lines2.slice(1).map((l) => l.split(",").map(Number));
    const fromScorer = loadScorer(readFileSync(artifact, "utf8"));
    expect(fromScorer.outcomes).toEqual(["open", "react", "reply", "save", "reshare", "hide"]);
    expect(first.slice(0, 6).every((p) => p > 0 && p < 1)).toBe(true);
  });
});
