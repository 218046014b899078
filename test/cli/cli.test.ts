import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { toolVersion } from "../../trainer/tool-version.js";
import { runCliCaptured as run } from "./run-cli-captured.js";

const dir = mkdtempSync(join(tmpdir(), "leafcast-cli-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("leafcast CLI", () => {
  it("reports the version of package.json", () => {
    const pkg = JSON.parse(readFileSync("package.json", "utf8")) as { version: string };
    expect(toolVersion).toBe(pkg.version);
  });

  it("writes one scenario file per day and inspects one as JSON", async () => {
    const out = join(dir, "plotline");
    const scenario = await run([
      "scenario",
      "--out",
      out,
      "--days",
      "3",
      "--rows-per-day",
      "500",
      "--json",
    ]);
    expect(scenario.code).toBe(0);
    expect(readdirSync(out).sort()).toEqual(["day-01.csv", "day-02.csv", "day-03.csv"]);
    const written = JSON.parse(scenario.out) as { rows: number };
    expect(written.rows).toBe(1500);

    const inspect = await run([
      "inspect",
      join(out, "day-02.csv"),
      "--schema",
      "datasets/plotline.schema.json",
      "--json",
    ]);
    expect(inspect.code).toBe(0);
    const report = JSON.parse(inspect.out) as {
      stats: { rowsAccepted: number; rowsRejected: number };
      columns: { name: string; rows: number; positiveRate?: number }[];
    };
    expect(report.stats).toMatchObject({ rowsAccepted: 500, rowsRejected: 0 });
    const open = report.columns.find((c) => c.name === "open");
    expect(open?.positiveRate).toBeGreaterThan(0.05);
  });

  it("stops on a bad cell with file, row and column, and sets bad rows aside on request", async () => {
    const schema = join(dir, "mini.schema.json");
    writeFileSync(
      schema,
      JSON.stringify({
        name: "mini",
        columns: [
          { name: "tie_strength", role: "numeric" },
          { name: "open", role: "outcome" },
        ],
      }),
    );
    const data = join(dir, "plots.csv");
    writeFileSync(data, "tie_strength,open\n0.5,1\nn/a,0\n0.25,2\n0.75,0\n");
    const failed = await run(["inspect", data, "--schema", schema]);
    expect(failed.code).toBe(2);
    expect(failed.err).toContain('column "tie_strength" expected a number, found "n/a"');
    expect(failed.err).toContain("row 2");

    const rejects = join(dir, "plots.rejects.ndjson");
    const skipped = await run([
      "inspect",
      data,
      "--schema",
      schema,
      "--skip-bad-rows",
      "--rejects",
      rejects,
      "--json",
    ]);
    expect(skipped.code).toBe(0);
    const report = JSON.parse(skipped.out) as {
      stats: { rowsAccepted: number; rowsRejected: number };
    };
    expect(report.stats).toMatchObject({ rowsAccepted: 2, rowsRejected: 2 });
    const lines = readFileSync(rejects, "utf8").trim().split("\n");
    expect(lines).toHaveLength(2);
  });

  it("refuses a bad option value with a clear message", async () => {
    const result = await run(["scenario", "--out", dir, "--days", "zero"]);
    expect(result.code).not.toBe(0);
    expect(result.err).toContain('expected a whole number >= 1, found "zero"');
  });
});
