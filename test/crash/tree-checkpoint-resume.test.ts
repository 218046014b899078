import { readFile, rm, stat } from "node:fs/promises";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import type { ResolvedSchema } from "../../trainer/schema/load-dataset-schema.js";
import {
  resolveTrainingConfig,
  type ResolvedTrainingConfig,
} from "../../trainer/schema/load-training-config.js";
import { decodeForestCheckpoint } from "../../trainer/trees/decode-forest-checkpoint.js";
import { encodeForestCheckpoint } from "../../trainer/trees/encode-forest-checkpoint.js";
import { fitTreesFromFile } from "../../trainer/trees/fit-trees-from-file.js";
import { writeForestFile } from "../../trainer/trees/write-forest-file.js";
import { writeFileAtomic } from "../../trainer/io/write-file-atomic.js";
import { binFeatures } from "../../trainer/trees/bin-features.js";
import { fitForests, type ForestSettings } from "../../trainer/trees/fit-forests.js";
import type { ForestProgress } from "../../trainer/trees/forest-checkpoint.js";
import { testRandom } from "../trees/tree-test-helpers.js";
import { sameBits } from "../pipeline/pipeline-fixtures.js";
import { plotlineDays, plotlineSchema } from "../pipeline/pipeline-fixtures.js";

// What is checked: fitting resumed from a checkpoint gives the forest file of an
// uninterrupted run byte for byte (the project's own determinism requirement,
// issue 7; boosting is a deterministic function of the sample, the seed and the
// scores, so "the same" means the same bits). Settings cover the paths that
// keep state across trees: early stopping on a validation set, row and column
// subsampling, two forests.
let dir = "";
let paths: string[] = [];
let schema: ResolvedSchema;
let config: ResolvedTrainingConfig;
let straight = "";

beforeAll(async () => {
  ({ dir, paths } = await plotlineDays("leafcast-tree-checkpoint-", {
    seed: 11,
    days: 2,
    rowsPerDay: 3000,
    authors: 200,
    viewers: 1500,
  }));
  schema = await plotlineSchema();
  config = resolveTrainingConfig({
    seed: 9,
    workers: 1,
    batchRows: 1000,
    trees: {
      count: 16,
      depth: 4,
      learningRate: 0.6,
      bins: 32,
      outcomes: ["open", "react"],
      validationFraction: 0.2,
      patience: 2,
      rowFraction: 0.8,
      featureFraction: 0.7,
    },
    checkpoint: { everyTrees: 1 },
  });
  const result = await fitTreesFromFile(paths, schema, config);
  await writeForestFile(join(dir, "straight.json"), result.forests);
  straight = await readFile(join(dir, "straight.json"), "utf8");
}, 60_000);
afterAll(() => rm(dir, { recursive: true, force: true }));

describe("tree-fitting checkpoints", () => {
  it("resume from any saved tree to the forests of an uninterrupted run, byte for byte", async () => {
    const checkpointPath = join(dir, "forests.json.checkpoint");
    // With a checkpoint after every tree, the last one holds every tree of both forests.
    await fitTreesFromFile(paths, schema, config, { checkpointPath });
    const checkpoint = decodeForestCheckpoint(await readFile(checkpointPath, "utf8"));
    const fitted = checkpoint.forests.map((f) => f.trees.length);
    expect(checkpoint.forests.every((f) => f.complete)).toBe(true);
    // Early stopping on the validation rows ended the first forest before its 16 trees.
    expect(fitted[0]).toBeLessThan(16);
    const total = fitted.reduce((a, b) => a + b, 0);
    // Cut the final checkpoint back to every tree count: each is what a kill after that tree leaves.
    const cuts = [0, 1, 2, fitted[0] - 1, fitted[0], fitted[0] + 1, total - 1];
    for (const cut of cuts) {
      let left = cut;
      const forests = [];
      for (const forest of checkpoint.forests) {
        if (left <= 0 && forests.length > 0) break;
        const k = Math.min(left, forest.trees.length);
        left -= k;
        forests.push({
          ...forest,
          trees: forest.trees.slice(0, k),
          trainLoss: forest.trainLoss.slice(0, k),
          validationLoss: forest.validationLoss?.slice(0, k) ?? null,
          complete: forest.complete && k === forest.trees.length,
        });
      }
      await writeFileAtomic(
        checkpointPath,
        encodeForestCheckpoint({ inputs: checkpoint.inputs, forests }),
      );
      let resumedTrees = -1;
      const result = await fitTreesFromFile(paths, schema, config, {
        checkpointPath,
        onResume: (trees) => {
          resumedTrees = trees;
        },
      });
      expect(resumedTrees).toBe(cut);
      const out = join(dir, `resumed-${cut}.json`);
      await writeForestFile(out, result.forests);
      expect(await readFile(out, "utf8"), `resumed after ${cut} trees`).toBe(straight);
    }
  }, 60_000);

  it("refuses a checkpoint made with other settings, naming what changed", async () => {
    const checkpointPath = join(dir, "other.json.checkpoint");
    await fitTreesFromFile(paths, schema, config, { checkpointPath });
    expect((await stat(checkpointPath)).size).toBeGreaterThan(0);
    const other = resolveTrainingConfig({
      seed: 10,
      workers: 1,
      batchRows: 1000,
      trees: { count: 12, depth: 3, bins: 32, outcomes: ["open", "react"] },
    });
    const resumed = fitTreesFromFile(paths, schema, other, { checkpointPath });
    await expect(resumed).rejects.toThrow(LeafcastError);
    await expect(resumed).rejects.toThrow(/cannot resume: the seed or tree settings expected/);
    // Other files are refused before anything is read.
    const fewer = fitTreesFromFile([paths[0]], schema, config, { checkpointPath });
    await expect(fewer).rejects.toMatchObject({ code: "inputs_changed" });
    // --restart ignores it.
    const fresh = await fitTreesFromFile(paths, schema, other, { checkpointPath, restart: true });
    expect(fresh.forests.forests.length).toBe(2);
  }, 60_000);

  it("gives back the same scores at the best tree when fitting resumes (fitForests)", async () => {
    const random = testRandom(5);
    const n = 3000;
    const x = Float64Array.from({ length: n }, () => random());
    const kind = Int32Array.from({ length: n }, () => Math.floor(random() * 4));
    const label = Uint8Array.from(x, (v, r) => (random() < 0.2 + 0.5 * v * (kind[r] % 2) ? 1 : 0));
    const binned = binFeatures(
      {
        rowCount: n,
        numeric: [{ name: "x", values: x }],
        categorical: [{ name: "kind", codes: kind, dictionary: ["a", "b", "c", "d"] }],
      },
      { bins: 32, binSampleRows: n, maxCategories: 8, seed: 1 },
    );
    const settings: ForestSettings = {
      count: 30,
      depth: 4,
      leaves: 16,
      learningRate: 0.8,
      l2: 0,
      minLeafHessian: 0,
      minSplitGain: 0,
      rowFraction: 0.7,
      featureFraction: 1,
      validationFraction: 0.3,
      patience: 3,
    };
    const targets = [{ outcome: "open", label }];
    const saved: ForestProgress[][] = [];
    const options = { settings, seed: 3, workers: 1, returnScores: true };
    const [straight] = await fitForests(binned, targets, {
      ...options,
      checkpoint: {
        resume: null,
        everyTrees: 1,
        everySeconds: 0,
        save: (forests) => {
          // A deep copy, as a file would hold it.
          saved.push(
            forests.map((f) => ({
              ...f,
              trees: [...f.trees],
              trainLoss: [...f.trainLoss],
              validationLoss: f.validationLoss === null ? null : [...f.validationLoss],
            })),
          );
          return Promise.resolve();
        },
      },
    });
    // Stopped early, keeping fewer trees than it fitted: the kept scores are those at the best tree.
    expect(straight.forest.trees.length).toBeLessThan(straight.treesFitted);
    for (const at of [
      1,
      straight.forest.trees.length - 1,
      straight.forest.trees.length,
      saved.length - 1,
    ]) {
      const [resumed] = await fitForests(binned, targets, {
        ...options,
        checkpoint: {
          resume: saved[at],
          everyTrees: 0,
          everySeconds: 0,
          save: () => Promise.resolve(),
        },
      });
      expect(resumed.forest.trees.length).toBe(straight.forest.trees.length);
      expect(
        sameBits(resumed.scores as Float64Array, straight.scores as Float64Array),
        `from ${at}`,
      ).toBe(true);
      expect(sameBits(resumed.trainLoss, straight.trainLoss)).toBe(true);
    }
  }, 60_000);
});
