import { readFileSync, writeFileSync } from "node:fs";
import { rm } from "node:fs/promises";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { loadDatasetSchema } from "../../trainer/schema/load-dataset-schema.js";
import { NOISE_FEATURES, pruningSchemaDocument, writePruningFixture } from "./pruning-fixture.js";
import { runCliCaptured as run } from "../cli/run-cli-captured.js";

// Invented ground truth: Plotline rows plus invented uniform-noise columns
// (pruning-fixture.ts); the noise columns carry no signal by construction.

let dir = "";
let path = "";

beforeAll(async () => {
  ({ dir, path } = await writePruningFixture());
  writeFileSync(join(dir, "schema.json"), JSON.stringify(pruningSchemaDocument()));
  writeFileSync(
    join(dir, "config.json"),
    JSON.stringify({
      seed: 3,
      workers: 1,
      trees: { count: 30, depth: 4, bins: 32, outcomes: ["open"] },
    }),
  );
}, 60_000);
afterAll(() => rm(dir, { recursive: true, force: true }));

describe("leafcast prune-features", () => {
  it("prints the table, writes the reduced schema and the report", async () => {
    const schemaOut = join(dir, "pruned.schema.json");
    const report = join(dir, "pruning.html");
    const result = await run([
      "prune-features",
      path,
      "--schema",
      join(dir, "schema.json"),
      "--config",
      join(dir, "config.json"),
      "--drop-per-step",
      "3",
      "--min-features",
      "4",
      "--ne-tolerance",
      "0.2%",
      "--schema-out",
      schemaOut,
      "--report",
      report,
    ]);
    expect(result.err).toMatch(/prune-features: 8 features, held-out NE open 0\.\d{5}/);
    expect(result.code).toBe(0);
    const lines = result.out.split("\n");
    expect(lines[0]).toMatch(
      /19200 training rows, 4800 held out \(the latest by time\); NE of each forest alone/,
    );
    expect(lines[1]).toMatch(/^features kept\s+NE open\s+dropped$/);
    expect(lines[2]).toMatch(/^\s+8\s+0\.\d{5}$/);
    // The first step drops the three noise columns, the weakest by gain.
    expect(lines[3]).toMatch(/^\s+5\s+0\.\d{5}\s+noise_[abc], noise_[abc], noise_[abc]$/);
    expect(lines[4]).toMatch(/^\s+4\s+0\.\d{5}\s+\w+\s+\(not kept/);
    expect(result.out).toContain("kept 5 features");
    // Every feature, noise included, gets some split here, so no unused line is printed.
    expect(result.out).not.toContain("no tree used");
    const reduced = await loadDatasetSchema(schemaOut);
    for (const name of NOISE_FEATURES) expect(reduced.byName.get(name)?.role).toBe("ignore");
    expect(reduced.numeric).toHaveLength(4);
    const html = readFileSync(report, "utf8");
    expect(html).toContain('id="pruning"');
    expect(html).toContain(schemaOut.replace(/&/g, "&amp;"));
  }, 60_000);

  it("refuses a bad --drop-per-step with a usage error", async () => {
    const result = await run([
      "prune-features",
      path,
      "--schema",
      "x.json",
      "--drop-per-step",
      "1.5",
    ]);
    expect(result.code).not.toBe(0);
    expect(result.err).toContain(
      'expected a whole number >= 1 or a share in (0, 1) such as 0.2 or 20%, found "1.5"',
    );
  });

  it("refuses --held-out 0 before reading any file", async () => {
    const result = await run(["prune-features", path, "--schema", "x.json", "--held-out", "0"]);
    expect(result.code).not.toBe(0);
    expect(result.err).toContain('expected a share in (0, 1) such as 0.2, found "0"');
  });

  it("measures trees plus heads with --with-heads and prints JSON", async () => {
    const result = await run([
      "prune-features",
      path,
      "--schema",
      join(dir, "schema.json"),
      "--config",
      join(dir, "config.json"),
      "--drop-per-step",
      "50%",
      "--min-features",
      "4",
      "--ne-tolerance",
      "0.5",
      "--with-heads",
      "--json",
    ]);
    expect(result.code).toBe(0);
    const body = JSON.parse(result.out) as {
      measure: string;
      steps: { featuresKept: number; heldOutNe: Record<string, number> }[];
      stopReason: string;
      importance: { feature: string; gainShare: number }[];
    };
    expect(body.measure).toBe("hybrid");
    expect(body.importance[0].gainShare).toBeGreaterThan(0);
    // 8 features, then ceil(0.5 * 8) = 4 dropped: the minimum is reached.
    expect(body.steps.map((s) => s.featuresKept)).toEqual([8, 4]);
    expect(body.stopReason).toBe("min_features");
    expect(body.steps[0].heldOutNe.open).toBeLessThan(1);
  }, 60_000);
});
