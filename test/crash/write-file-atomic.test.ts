import { spawnSync } from "node:child_process";
import { mkdir, mkdtemp, readdir, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { CheckpointSchedule } from "../../trainer/io/checkpoint-schedule.js";
import { removeStaleTemps } from "../../trainer/io/remove-stale-temps.js";
import { tempPathFor } from "../../trainer/io/temp-path-for.js";
import { writeFileAtomic } from "../../trainer/io/write-file-atomic.js";

// What is checked: the parts of an atomic write that a kill test cannot reach
// on purpose: writes racing in one millisecond, a failed rename, and which
// leftover temporary files a later write may remove (those of processes that
// no longer run, never those of live ones). Temp + fsync + rename is common
// practice for crash-safe files (POSIX rename(2) replaces the target atomically).
let dir = "";
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), "leafcast-write-atomic-"));
});
afterAll(() => rm(dir, { recursive: true, force: true }));

describe("writeFileAtomic", () => {
  it("gives each of many racing writes its own temporary file; one whole write wins", async () => {
    const path = join(dir, "race.bin");
    const contents = Array.from({ length: 8 }, (_, i) => new Uint8Array(100_000 + i).fill(i + 1));
    await Promise.all(contents.map((bytes) => writeFileAtomic(path, bytes)));
    const found = await readFile(path);
    expect(contents.some((bytes) => Buffer.from(bytes).equals(found))).toBe(true);
    expect((await readdir(dir)).filter((name) => name.startsWith(".race.bin."))).toEqual([]);
  });

  it("removes its temporary file when the rename fails, and leaves the target alone", async () => {
    const path = join(dir, "a-directory");
    await mkdir(path);
    await writeFile(join(path, "inside.txt"), "kept");
    await expect(writeFileAtomic(path, "text")).rejects.toThrow();
    expect((await readdir(dir)).filter((name) => name.startsWith(".a-directory."))).toEqual([]);
    expect(await readFile(join(path, "inside.txt"), "utf8")).toBe("kept");
  });

  it("cleans up the temporary files of dead writers only", async () => {
    const path = join(dir, "model.json");
    // A process id that no longer runs: a child that has ended.
    const gone = spawnSync(process.execPath, ["-e", "process.stdout.write(String(process.pid))"]);
    const deadPid = Number(gone.stdout.toString());
    const dead = join(dir, `.model.json.${deadPid}.1764640000000.0.tmp`);
    const mine = tempPathFor(path);
    const live = join(dir, `.model.json.${process.ppid}.1764640000000.3.tmp`);
    const unrelated = join(dir, ".model.json.notes.tmp");
    for (const file of [dead, mine, live, unrelated]) await writeFile(file, "partial");
    expect(mine).toMatch(new RegExp(`\\.model\\.json\\.${process.pid}\\.\\d{13}\\.\\d+\\.tmp$`));
    await writeFileAtomic(path, "{}\n");
    const names = (await readdir(dir)).filter((name) => name.startsWith(".model.json."));
    expect(names.sort()).toEqual(
      [mine, live, unrelated].map((file) => file.slice(dir.length + 1)).sort(),
    );
    expect(await removeStaleTemps(path)).toBe(0);
  });
});

describe("CheckpointSchedule", () => {
  it("is due every n units or every t seconds, whichever comes first", () => {
    let now = 0;
    const schedule = new CheckpointSchedule(3, 10, () => now);
    expect([1, 1, 1, 1].map((units) => schedule.advance(units))).toEqual([
      false,
      false,
      true,
      false,
    ]);
    now = 10_000;
    expect(schedule.advance(0)).toBe(true);
    const byTime = new CheckpointSchedule(0, 0, () => now);
    expect(byTime.advance(1_000_000)).toBe(false);
  });
});
