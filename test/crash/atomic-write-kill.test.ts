import { spawn } from "node:child_process";
import { existsSync, readdirSync, readFileSync } from "node:fs";
import { mkdtemp, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ensureBuiltCli } from "./ensure-built-cli.js";
// @ts-expect-error: a plain ES module shared with the child process, without types.
import { blobOf, CSV_ROWS, REJECT_ROWS } from "./atomic-write-contents.mjs";

// What is checked (issue 7, "Crash-safe"): a process killed with SIGKILL at
// any moment while it writes never leaves a torn file at a target path. A child
// writes three large files over and over through the tool's writers (the
// whole-file writeFileAtomic, the streaming data-file writer, the rejects
// writer) and is killed at seeded random moments; after every kill each target
// holds one complete generation (the last finished, or the next when the kill
// came between its rename and the report of it). Temporary files a kill leaves
// are named `.<target>.<pid>.<ms>.<n>.tmp` and go with the next successful
// write of that target.
const TARGETS = ["blob.bin", "rows.csv", "rejects.ndjson"] as const;
type Target = (typeof TARGETS)[number];
const TEMP = /^\.(blob\.bin|rows\.csv|rejects\.ndjson)\.(\d+)\.\d{12,}\.\d+\.tmp$/;
let dir = "";

beforeAll(async () => {
  await ensureBuiltCli();
  dir = await mkdtemp(join(tmpdir(), "leafcast-atomic-kill-"));
}, 120_000);
afterAll(() => rm(dir, { recursive: true, force: true }));

/** The generation a target holds, or throws when it is not one complete generation. */
function generationOf(target: Target): number {
  const bytes = readFileSync(join(dir, target));
  if (target === "blob.bin") {
    const g = Number(/^generation (\d+)\n/.exec(bytes.subarray(0, 32).toString())?.[1]);
    if (!Buffer.from(blobOf(g)).equals(bytes))
      throw new Error(`blob.bin is not generation ${g} whole`);
    return g;
  }
  const lines = bytes.toString().split("\n");
  if (lines.pop() !== "") throw new Error(`${target} does not end with a newline`);
  if (target === "rows.csv") {
    if (lines.shift() !== "generation,row" || lines.length !== CSV_ROWS) {
      throw new Error(`rows.csv has ${lines.length} rows, expected ${CSV_ROWS}`);
    }
    const g = Number(lines[0].split(",")[0]);
    lines.forEach((line, r) => {
      if (line !== `${g},${r}`) throw new Error(`rows.csv row ${r + 1} is "${line}"`);
    });
    return g;
  }
  if (lines.length !== REJECT_ROWS) throw new Error(`rejects has ${lines.length} records`);
  const g = Number(/day-(\d+)\.csv/.exec(lines[0])?.[1]);
  lines.forEach((line, r) => {
    const record = JSON.parse(line) as { file: string; row: number };
    if (record.file !== `day-${g}.csv` || record.row !== r + 1) throw new Error(`record ${r + 1}`);
  });
  return g;
}

/** Runs the child from generation `first`; SIGKILLs it `delayMs` after its `afterDone`-th report. */
function runChild(
  first: number,
  afterDone: number,
  delayMs: number,
): Promise<{ done: Map<Target, number>; pid: number }> {
  const child = spawn(
    process.execPath,
    ["test/crash/atomic-writer-child.mjs", dir, String(first)],
    { stdio: ["ignore", "pipe", "inherit"] },
  );
  const done = new Map<Target, number>();
  let reports = 0;
  let text = "";
  child.stdout.on("data", (chunk: Buffer) => {
    text += chunk.toString();
    const lines = text.split("\n");
    text = lines.pop() ?? "";
    for (const line of lines) {
      const [, target, g] = line.split(" ");
      done.set(target as Target, Number(g));
      if (++reports === afterDone) setTimeout(() => child.kill("SIGKILL"), delayMs);
    }
  });
  return new Promise((resolve, reject) => {
    child.on("error", reject);
    child.on("close", (_code, signal) => {
      if (signal !== "SIGKILL") reject(new Error(`child ended without being killed (${signal})`));
      else resolve({ done, pid: child.pid ?? -1 });
    });
  });
}

describe("writes killed with SIGKILL", () => {
  it("leave every target whole: the old generation or the new one, never torn", async () => {
    let a = 7;
    const random = (): number => {
      a = (Math.imul(a, 1103515245) + 12345) >>> 0;
      return a / 4294967296;
    };
    const last = new Map<Target, number>();
    let next = 1;
    let tempsSeen = 0;
    const kills = 10;
    for (let k = 0; k < kills; k++) {
      // At least one report (so each run writes something whole), then a kill mid-write.
      const { done } = await runChild(
        next,
        1 + Math.floor(random() * 4),
        Math.floor(random() * 120),
      );
      for (const target of TARGETS) {
        if (!existsSync(join(dir, target))) {
          expect(last.has(target) || done.has(target), `${target} vanished`).toBe(false);
          continue;
        }
        // The last generation reported, or the one being written when the kill came
        // (its rename may have happened before the report).
        const reported = done.get(target) ?? last.get(target) ?? 0;
        const writing = done.has(target) ? reported + 1 : next;
        const g = generationOf(target);
        expect([reported, writing], `${target} after kill ${k + 1}`).toContain(g);
        last.set(target, g);
      }
      const temps = readdirSync(dir).filter((name) => name.startsWith("."));
      expect(
        temps.every((name) => TEMP.test(name)),
        temps.join(", "),
      ).toBe(true);
      tempsSeen += temps.length;
      next = Math.max(...last.values()) + 1;
    }
    console.log(`atomic-write-kill: ${kills} kills; ${tempsSeen} leftover temporary files seen`);
    // One more run writes every target once more: the temporary files earlier
    // runs left are gone; only this run's own (killed) write may have left one.
    const { pid } = await runChild(next, 3, 0);
    const left = readdirSync(dir).filter((name) => name.startsWith("."));
    expect(
      left.filter((name) => Number(TEMP.exec(name)?.[2]) !== pid),
      left.join(", "),
    ).toEqual([]);
  }, 180_000);
});
