import { existsSync, readFileSync, readdirSync } from "node:fs";
import { mkdir, readFile, rm, writeFile } from "node:fs/promises";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { decodeHeadCheckpoint } from "../../trainer/heads/decode-head-checkpoint.js";
import { decodeForestCheckpoint } from "../../trainer/trees/decode-forest-checkpoint.js";
import { plotlineDays } from "../pipeline/pipeline-fixtures.js";
import { testRandom } from "../trees/tree-test-helpers.js";
import { runCliChild, type KillPlan } from "./cli-child.js";
import { ensureBuiltCli } from "./ensure-built-cli.js";

// What is checked (issue 7, "Crash-safe"): the real command line, killed with
// SIGKILL at seeded random moments during fit-trees, learn-heads and
// update-heads and started again each time, ends with the forest file, the
// head states and the scorer artifact of an uninterrupted run, byte for byte
// (the artifact apart from its creation time and the checksum that covers it).
// Checkpoints are frequent (every 2 trees, every 600 rows), so kills land
// between checkpoints as well as during them; most kills come a random moment
// after a progress line, the others at a random time while the command starts,
// reads or resumes.
const schema = "datasets/plotline.schema.json";
let dir = "";
let days: string[] = [];

beforeAll(async () => {
  await ensureBuiltCli();
  ({ dir, paths: days } = await plotlineDays("leafcast-kill-resume-", {
    seed: 17,
    days: 3,
    rowsPerDay: 2000,
    authors: 200,
    viewers: 1500,
  }));
  await writeFile(
    join(dir, "config.json"),
    JSON.stringify({
      seed: 6,
      workers: 2,
      batchRows: 300,
      trees: {
        count: 8,
        depth: 4,
        bins: 32,
        outcomes: ["open", "react"],
        validationFraction: 0.2,
        rowFraction: 0.8,
      },
      heads: {
        alpha: 0.1,
        hashBits: 12,
        numeric: ["tie_strength"],
        negativeKeepRate: { hide: 0.3 },
        // Snapshots every 250 rows fall inside batches of 300 and between checkpoints.
        averaging: { halfLifeRows: 1000, everyRows: 250 },
      },
      checkpoint: { everyTrees: 2, everyRows: 600 },
    }),
  );
}, 120_000);
afterAll(() => rm(dir, { recursive: true, force: true }));

interface Step {
  readonly name: string;
  readonly args: string[];
  /** The stderr lines that mark progress: one per tree, or one per checkpoint (null: none). */
  readonly progress: RegExp | null;
  /** SIGKILLs to send before letting the command finish. */
  readonly kills: number;
}

/** The four commands of a daily pipeline, writing into `out`. */
function pipeline(out: string): Step[] {
  const config = ["-s", schema, "-c", join(dir, "config.json")];
  const forests = join(out, "forests.json");
  return [
    {
      name: "fit-trees",
      args: ["fit-trees", days[0], days[1], ...config, "-o", forests],
      progress: /^forest \d+\/\d+ /,
      kills: 2,
    },
    {
      name: "learn-heads",
      args: ["learn-heads", days[0], days[1], ...config, "-t", forests, "-o", join(out, "a.state")],
      progress: /checkpoint at \d+ rows/,
      kills: 2,
    },
    {
      name: "update-heads",
      args: [
        "update-heads",
        days[2],
        ...config,
        "-t",
        forests,
        "-H",
        join(out, "a.state"),
        "-o",
        join(out, "b.state"),
      ],
      progress: /checkpoint at \d+ rows/,
      kills: 2,
    },
    {
      name: "export-scorer",
      args: [
        "export-scorer",
        "-t",
        forests,
        "-H",
        join(out, "b.state"),
        "-o",
        join(out, "model.json"),
      ],
      progress: null,
      kills: 1,
    },
  ];
}

/**
 * How far a checkpoint got, in progress lines of an uninterrupted run: the trees
 * it holds, or the checkpoint lines of rows it has learned. 0 without one.
 */
async function linesDone(
  step: Step,
  out: string,
  straightLines: readonly string[],
): Promise<number> {
  const path = `${out}.checkpoint`;
  if (!existsSync(path)) return 0;
  if (step.name === "fit-trees") {
    const checkpoint = decodeForestCheckpoint(await readFile(path, "utf8"));
    return checkpoint.forests.reduce((sum, forest) => sum + forest.trees.length, 0);
  }
  const rows = decodeHeadCheckpoint(await readFile(path)).state.rowCount;
  return straightLines.filter((line) => Number(/at (\d+) rows/.exec(line)?.[1]) <= rows).length;
}

/** The artifact without its creation time and the checksum over it. */
async function artifactWithoutTime(path: string): Promise<string> {
  const text = await readFile(path, "utf8");
  const masked = text
    .replace(/"createdAt":\s*"[^"]*"/, '"createdAt":""')
    .replace(/"checksum":\s*"sha256:[0-9a-f]+"/, '"checksum":""');
  expect(masked).not.toBe(text);
  return masked;
}

describe("SIGKILL and resume through the command line", () => {
  it("ends with the forests, heads and artifact of an uninterrupted run", async () => {
    const straight = join(dir, "straight");
    await mkdir(straight);
    const baseline = new Map<string, { ms: number; lines: string[] }>();
    for (const step of pipeline(straight)) {
      const end = await runCliChild(step.args, null, step.progress ?? undefined);
      expect(end.code, `${step.name}: ${end.stderr}`).toBe(0);
      const lines = end.stderr.split("\n").filter((line) => step.progress?.test(line) === true);
      baseline.set(step.name, { ms: end.ms, lines });
    }

    const killed = join(dir, "killed");
    await mkdir(killed);
    const random = testRandom(20261202);
    const kills: string[] = [];
    let landedAfterCheckpoint = 0;
    for (const step of pipeline(killed)) {
      const out = step.args[step.args.indexOf("-o") + 1];
      const { ms, lines } = baseline.get(step.name) ?? { ms: 0, lines: [] };
      let left = step.kills;
      let runs = 0;
      while (true) {
        runs++;
        expect(runs, `${step.name} should finish`).toBeLessThan(10);
        let plan: KillPlan = null;
        const remaining = lines.length - (await linesDone(step, out, lines));
        if (left > 0 && remaining >= 2 && random() < 0.75) {
          // After one of the progress lines still to come (not the last), at a random moment.
          const afterLine = 1 + Math.floor(random() * (remaining - 1));
          plan = { afterLine, delayMs: Math.floor(random() * 80) };
        } else if (left > 0) {
          // Early: while starting, reading, binning or resuming.
          plan = { afterMs: Math.floor((0.1 + 0.3 * random()) * ms) };
        }
        const resumes = existsSync(`${out}.checkpoint`);
        const end = await runCliChild(step.args, plan, step.progress ?? undefined);
        if (!end.killed) {
          expect(end.code, `${step.name}: ${end.stderr}`).toBe(0);
          // A checkpoint left by a kill is taken up, not ignored.
          if (resumes) expect(end.stderr).toMatch(/resuming from /);
          break;
        }
        left--;
        const checkpoint = existsSync(`${out}.checkpoint`);
        if (checkpoint) landedAfterCheckpoint++;
        kills.push(
          `${step.name} killed ${JSON.stringify(plan)} after ${Math.round(end.ms)} ms and ${end.lines} progress lines; checkpoint ${checkpoint ? "kept" : "none yet"}`,
        );
        // No partial output: the target is absent, or (killed after its rename) complete.
        if (existsSync(out) && /\.json$/.test(out)) {
          expect(() => JSON.parse(readFileSync(out, "utf8"))).not.toThrow();
        }
      }
    }
    console.log(
      `kill-resume: ${kills.length} SIGKILL and resume cycles (${landedAfterCheckpoint} after a checkpoint was saved)\n  ${kills.join("\n  ")}`,
    );
    // Two kills in each training command and one in export-scorer; a kill planned
    // early may come after a short run has already ended.
    expect(kills.length).toBeGreaterThanOrEqual(5);

    for (const file of ["forests.json", "a.state", "b.state"]) {
      const a = await readFile(join(straight, file));
      const b = await readFile(join(killed, file));
      expect(b.equals(a), `${file} differs after kills`).toBe(true);
    }
    expect(await artifactWithoutTime(join(killed, "model.json"))).toBe(
      await artifactWithoutTime(join(straight, "model.json")),
    );
    // Checkpoints are gone once their runs finished, and no temporary file is left.
    expect(readdirSync(killed).sort()).toEqual([
      "a.state",
      "b.state",
      "forests.json",
      "model.json",
    ]);
  }, 300_000);
});
