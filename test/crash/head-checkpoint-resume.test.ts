import { readFile, rm, writeFile } from "node:fs/promises";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import { decodeHeadCheckpoint } from "../../trainer/heads/decode-head-checkpoint.js";
import { decodeHeadState } from "../../trainer/heads/decode-head-state.js";
import { encodeHeadState } from "../../trainer/heads/encode-head-state.js";
import type { HeadState } from "../../trainer/heads/head-state.js";
import { learnHeadsFromFiles } from "../../trainer/pipeline/learn-heads-from-files.js";
import type { ResolvedSchema } from "../../trainer/schema/load-dataset-schema.js";
import {
  resolveTrainingConfig,
  type ResolvedTrainingConfig,
} from "../../trainer/schema/load-training-config.js";
import { fitTreesFromFile } from "../../trainer/trees/fit-trees-from-file.js";
import type { ForestFile } from "../../trainer/trees/forest-file.js";
import { plotlineDays, plotlineSchema } from "../pipeline/pipeline-fixtures.js";

// What is checked: heads resumed from a checkpoint (state plus position in the
// files) equal the heads of an uninterrupted run bit for bit, whatever batch the
// checkpoint was taken after, for fresh heads and for heads continued from a
// saved state (FTRL-Proximal, McMahan et al. 2013, is a deterministic function
// of the row sequence; downsampling draws are keyed by the absolute row number,
// so the row numbering must carry over exactly too).
let dir = "";
let paths: string[] = [];
let schema: ResolvedSchema;
let config: ResolvedTrainingConfig;
let forests: ForestFile;

beforeAll(async () => {
  ({ dir, paths } = await plotlineDays("leafcast-head-checkpoint-", {
    seed: 21,
    days: 3,
    rowsPerDay: 2000,
    authors: 200,
    viewers: 1500,
  }));
  schema = await plotlineSchema();
  config = resolveTrainingConfig({
    seed: 4,
    workers: 1,
    batchRows: 700,
    trees: { count: 4, depth: 3, bins: 32, outcomes: ["open", "react"], validationFraction: 0 },
    heads: {
      alpha: 0.1,
      numeric: ["tie_strength"],
      hashBits: 10,
      negativeKeepRate: { hide: 0.3, reply: 0.5 },
    },
    checkpoint: { everyRows: 1000 },
  });
  forests = (await fitTreesFromFile(paths[0], schema, config)).forests;
}, 60_000);
afterAll(() => rm(dir, { recursive: true, force: true }));

/** Runs to the end, keeping a copy of every checkpoint written. */
async function runKeepingCheckpoints(
  files: string[],
  checkpointPath: string,
  state?: HeadState,
): Promise<{ final: Uint8Array; checkpoints: Uint8Array[] }> {
  const checkpoints: Uint8Array[] = [];
  const result = await learnHeadsFromFiles(files, schema, config, forests, {
    workers: 1,
    state,
    checkpointPath,
    onCheckpoint: async () => {
      checkpoints.push(await readFile(checkpointPath));
    },
  });
  return { final: encodeHeadState(result.state), checkpoints };
}

describe("head-learning checkpoints", () => {
  it("resume after any batch to the heads of an uninterrupted run, bit for bit", async () => {
    const checkpointPath = join(dir, "heads.state.checkpoint");
    const { final, checkpoints } = await runKeepingCheckpoints(paths, checkpointPath);
    // 6,000 rows in batches of 700 cut at each day's end: a checkpoint each time a 1,000 is passed.
    expect(checkpoints.length).toBe(6);
    const positions = checkpoints.map((c) => decodeHeadCheckpoint(c).position);
    expect(positions[0]).toEqual({ file: 0, rows: 1400 });
    expect(new Set(positions.map((p) => p.file)).size).toBe(3);
    for (const [k, bytes] of checkpoints.entries()) {
      await writeFile(checkpointPath, bytes);
      let resumedAt = -1;
      const resumed = await learnHeadsFromFiles(paths, schema, config, forests, {
        workers: k % 2,
        checkpointPath,
        onResume: (c) => {
          resumedAt = c.state.rowCount;
        },
      });
      expect(resumedAt).toBe(decodeHeadCheckpoint(bytes).state.rowCount);
      expect(Buffer.from(encodeHeadState(resumed.state)).equals(final), `checkpoint ${k}`).toBe(
        true,
      );
      expect(resumed.reads.map((r) => r.rowsAccepted)).toEqual([2000, 2000, 2000]);
    }
  }, 60_000);

  it("resumes an update of saved heads, and refuses other starting heads", async () => {
    const first = await learnHeadsFromFiles([paths[0]], schema, config, forests, { workers: 0 });
    const savedBytes = encodeHeadState(first.state);
    const start = (): HeadState => decodeHeadState(savedBytes);
    const checkpointPath = join(dir, "update.state.checkpoint");
    const { final, checkpoints } = await runKeepingCheckpoints(
      paths.slice(1),
      checkpointPath,
      start(),
    );
    expect(checkpoints.length).toBeGreaterThan(2);
    await writeFile(checkpointPath, checkpoints[1]);
    const resumed = await learnHeadsFromFiles(paths.slice(1), schema, config, forests, {
      workers: 1,
      state: start(),
      checkpointPath,
    });
    expect(Buffer.from(encodeHeadState(resumed.state)).equals(final)).toBe(true);

    // Fresh heads are not the heads the checkpoint continued.
    const other = learnHeadsFromFiles(paths.slice(1), schema, config, forests, {
      workers: 0,
      checkpointPath,
    });
    await expect(other).rejects.toThrow(LeafcastError);
    await expect(other).rejects.toThrow(/cannot resume: the starting heads \(hash\) expected/);
    // A damaged checkpoint is refused with a clear error, not half used.
    await writeFile(checkpointPath, checkpoints[1].subarray(0, 100));
    const damaged = learnHeadsFromFiles(paths.slice(1), schema, config, forests, {
      workers: 0,
      state: start(),
      checkpointPath,
    });
    await expect(damaged).rejects.toMatchObject({ code: "damaged_checkpoint" });
  }, 60_000);
});
