import { mkdir, readFile, rm, stat, writeFile } from "node:fs/promises";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { loadHeadState } from "../../trainer/heads/load-head-state.js";
import { writePlotlineDays } from "../../datasets/plotline/write-plotline-days.js";
import { plotlineDays } from "./pipeline-fixtures.js";
import { runCliCaptured as run } from "../cli/run-cli-captured.js";

// What is checked: the learn-heads and update-heads commands wire files, trees,
// configuration and saved heads together, write the state atomically and print
// per-head progressive figures; numbers are checked by the pipeline tests.
let dir = "";
let paths: string[] = [];
const schemaPath = "datasets/plotline.schema.json";

interface HeadsJson {
  out: string;
  rowsLearned: number;
  rowsTotal: number;
  rowsRejected: number;
  heads: {
    outcome: string;
    overall: { rows: number; logLoss: number; normalizedEntropy: number; calibration: number };
    lastSlice: { start: string; rows: number } | null;
  }[];
}

beforeAll(async () => {
  ({ dir, paths } = await plotlineDays("leafcast-head-commands-", {
    seed: 9,
    days: 3,
    rowsPerDay: 3000,
    authors: 200,
    viewers: 1500,
  }));
  const config = {
    workers: 1,
    trees: { count: 5, depth: 3, bins: 32, outcomes: ["open", "react"] },
    heads: { alpha: 0.1, hashBits: 12, numeric: ["tie_strength"] },
  };
  await writeFile(join(dir, "config.json"), JSON.stringify(config));
  const other = { ...config, trees: { ...config.trees, outcomes: ["open"] } };
  await writeFile(join(dir, "other.json"), JSON.stringify(other));
}, 60_000);
afterAll(() => rm(dir, { recursive: true, force: true }));

describe("leafcast learn-heads and update-heads", () => {
  it("learns heads on the first days, updates them on the next and prints the figures", async () => {
    const config = join(dir, "config.json");
    const trees = join(dir, "forests.json");
    const fit = await run([
      "fit-trees",
      paths[0],
      "-s",
      schemaPath,
      "-c",
      config,
      "-o",
      trees,
      "-q",
    ]);
    expect(fit.code).toBe(0);
    const first = join(dir, "heads-1.state");
    const learn = await run([
      "learn-heads",
      paths[0],
      paths[1],
      "--schema",
      schemaPath,
      "--trees",
      trees,
      "--config",
      config,
      "--out",
      first,
      "--json",
    ]);
    expect(learn.err).toBe("");
    expect(learn.code).toBe(0);
    const learned = JSON.parse(learn.out) as HeadsJson;
    expect(learned.rowsLearned).toBe(6000);
    expect(learned.heads.map((h) => h.outcome)).toEqual([
      "open",
      "react",
      "reply",
      "save",
      "reshare",
      "hide",
    ]);
    const open = learned.heads[0];
    expect(open.overall.rows).toBe(6000);
    expect(open.overall.normalizedEntropy).toBeGreaterThan(0);
    expect(open.overall.normalizedEntropy).toBeLessThan(1);
    expect(open.lastSlice?.start).toBe("2025-06-03T00:00:00.000Z");
    expect((await loadHeadState(first)).rowCount).toBe(6000);

    const second = join(dir, "heads-2.state");
    const update = await run([
      "update-heads",
      paths[2],
      "-s",
      schemaPath,
      "-t",
      trees,
      "-H",
      first,
      "-c",
      config,
      "-o",
      second,
    ]);
    expect(update.code).toBe(0);
    expect(update.out).toMatch(/^update-heads: learned 3000 rows \(9000 in all\)/);
    expect(update.out).toMatch(/ {2}open: log loss \d\.\d{5}, NE 0\.\d{4}, calibration \d\.\d{3}/);
    expect((await stat(second)).size).toBeGreaterThan(0);

    // Heads learned on these trees refuse trees fitted otherwise: exit code 2, a clear message.
    const otherTrees = join(dir, "other-forests.json");
    const other = join(dir, "other.json");
    expect(
      (await run(["fit-trees", paths[0], "-s", schemaPath, "-c", other, "-o", otherTrees, "-q"]))
        .code,
    ).toBe(0);
    const refused = await run([
      "update-heads",
      paths[2],
      "-s",
      schemaPath,
      "-t",
      otherTrees,
      "-H",
      first,
      "-c",
      config,
      "-o",
      join(dir, "never.state"),
    ]);
    expect(refused.code).toBe(2);
    expect(refused.err).toMatch(
      /^heads: cannot resume: trees fingerprint expected "sha256:[0-9a-f]+"/,
    );
    await expect(stat(join(dir, "never.state"))).rejects.toThrow();
  }, 60_000);

  it("sets bad rows aside with --skip-bad-rows and --rejects, and counts them", async () => {
    const config = join(dir, "config.json");
    const trees = join(dir, "forests-for-csv.json");
    expect(
      (await run(["fit-trees", paths[0], "-s", schemaPath, "-c", config, "-o", trees, "-q"])).code,
    ).toBe(0);
    await mkdir(join(dir, "csv"));
    const [day] = await writePlotlineDays(join(dir, "csv"), "csv", {
      seed: 9,
      days: 1,
      rowsPerDay: 300,
      authors: 200,
      viewers: 1500,
    });
    // Data row 5 gets a tie strength that is not a number.
    const lines = (await readFile(day.path, "utf8")).split("\n");
    const tie = lines[0].split(",").indexOf("tie_strength");
    const cells = lines[5].split(",");
    cells[tie] = "n/a";
    lines[5] = cells.join(",");
    await writeFile(day.path, lines.join("\n"));
    const args = ["learn-heads", day.path, "-s", schemaPath, "-t", trees, "-c", config];
    const failed = await run([...args, "-o", join(dir, "csv-fail.state")]);
    expect(failed.code).toBe(2);
    expect(failed.err).toMatch(/column "tie_strength" expected a number, found "n\/a"/);
    const rejects = join(dir, "rejects.ndjson");
    const skipped = await run([
      ...args,
      "-o",
      join(dir, "csv.state"),
      "--skip-bad-rows",
      "--rejects",
      rejects,
      "--json",
    ]);
    expect(skipped.code).toBe(0);
    const summary = JSON.parse(skipped.out) as HeadsJson;
    expect([summary.rowsLearned, summary.rowsRejected]).toEqual([299, 1]);
    expect((await readFile(rejects, "utf8")).trim().split("\n")).toHaveLength(1);
  }, 60_000);
});
