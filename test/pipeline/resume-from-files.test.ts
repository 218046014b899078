import { rm, stat } from "node:fs/promises";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import type { HeadState } from "../../trainer/heads/head-state.js";
import { loadHeadState } from "../../trainer/heads/load-head-state.js";
import { saveHeadState } from "../../trainer/heads/save-head-state.js";
import { learnHeadsFromFiles } from "../../trainer/pipeline/learn-heads-from-files.js";
import {
  resolveDatasetSchema,
  type ResolvedSchema,
} from "../../trainer/schema/load-dataset-schema.js";
import {
  resolveTrainingConfig,
  type ResolvedTrainingConfig,
} from "../../trainer/schema/load-training-config.js";
import { fitTreesFromFile } from "../../trainer/trees/fit-trees-from-file.js";
import type { ForestFile } from "../../trainer/trees/forest-file.js";
import { plotlineDays, plotlineSchema, sameBits } from "./pipeline-fixtures.js";

// What is checked: the requirement that resuming from saved state on day
// k+1 gives exactly the heads of one uninterrupted run over days 1..k+1, here
// through the file pipeline (reading, encoding with the scorer's RowEncoder,
// standardized numerics measured once and kept in the state, checkpoints, the
// saved file). FTRL-Proximal (McMahan et al. 2013) is a deterministic function of
// the row sequence, so "exactly" means bit for bit.
let dir = "";
let paths: string[] = [];
let schema: ResolvedSchema;
let config: ResolvedTrainingConfig;
let forests: ForestFile;
let otherForests: ForestFile;

beforeAll(async () => {
  ({ dir, paths } = await plotlineDays("leafcast-pipeline-resume-", {
    seed: 5,
    days: 3,
    rowsPerDay: 4000,
    authors: 300,
    viewers: 2000,
  }));
  schema = await plotlineSchema();
  const configWith = (treeOutcomes: string[]): ResolvedTrainingConfig =>
    resolveTrainingConfig({
      seed: 4,
      workers: 1,
      batchRows: 1500,
      trees: { count: 8, depth: 3, bins: 32, outcomes: treeOutcomes, validationFraction: 0 },
      heads: {
        alpha: 0.1,
        numeric: ["tie_strength", "feed_position"],
        crosses: [["post_type", "device"]],
        hashBits: 12,
        negativeKeepRate: { hide: 0.3, reply: 0.5 },
      },
      checkpoint: { everyRows: 2500 },
    });
  config = configWith(["open", "react"]);
  forests = (await fitTreesFromFile(paths[0], schema, config)).forests;
  otherForests = (await fitTreesFromFile(paths[0], schema, configWith(["open"]))).forests;
}, 60_000);
afterAll(() => rm(dir, { recursive: true, force: true }));

function expectSameHeads(a: HeadState, b: HeadState): void {
  expect(sameBits(a.z, b.z)).toBe(true);
  expect(sameBits(a.n, b.n)).toBe(true);
  expect(sameBits(a.progressive.overall, b.progressive.overall)).toBe(true);
  expect(a.rowCount).toBe(b.rowCount);
  expect(a.info).toEqual(b.info);
}

describe("learnHeadsFromFiles", () => {
  it("resumed from a saved state on day 3 gives bit for bit the heads of one run over days 1-3", async () => {
    const straight = await learnHeadsFromFiles(paths, schema, config, forests, { workers: 0 });
    expect(straight.state.rowCount).toBe(12_000);
    const checkpoint = join(dir, "checkpoint.state");
    let checkpoints = 0;
    const firstTwo = await learnHeadsFromFiles(paths.slice(0, 2), schema, config, forests, {
      workers: 0,
      checkpointPath: checkpoint,
      onCheckpoint: () => {
        checkpoints++;
      },
    });
    // 8,000 rows in batches of 1,500 (cut at day ends) pass 2,500, 5,000 and 7,500.
    expect(checkpoints).toBe(3);
    expect((await stat(checkpoint)).size).toBeGreaterThan(0);
    const savedPath = join(dir, "two-days.state");
    await saveHeadState(savedPath, firstTwo.state);
    const saved = await loadHeadState(savedPath);
    // Standardization measured on the first batch of day 1 is kept, not measured again on day 3.
    expect(saved.info.encoding.numeric.map((s) => s.name)).toEqual([
      "tie_strength",
      "feed_position",
    ]);
    const resumed = await learnHeadsFromFiles([paths[2]], schema, config, forests, {
      state: saved,
      workers: 1,
    });
    expectSameHeads(resumed.state, straight.state);
    expect(resumed.report.map((h) => h.overall.normalizedEntropy)).toEqual(
      straight.report.map((h) => h.overall.normalizedEntropy),
    );
  }, 60_000);

  it("refuses to resume on other trees or another schema, naming what changed", async () => {
    const first = await learnHeadsFromFiles([paths[0]], schema, config, forests, { workers: 0 });
    const onOtherTrees = learnHeadsFromFiles([paths[1]], schema, config, otherForests, {
      state: first.state,
      workers: 0,
    });
    await expect(onOtherTrees).rejects.toThrow(LeafcastError);
    await expect(onOtherTrees).rejects.toThrow(/cannot resume: trees fingerprint expected/);
    await expect(onOtherTrees).rejects.toMatchObject({ code: "trees_changed" });

    // The same columns, but "garden_site" is no longer a feature: the state's
    // coordinates would mean something else.
    const document = structuredClone(schema.document);
    for (const column of document.columns)
      if (column.name === "garden_site") column.role = "ignore";
    const otherSchema = resolveDatasetSchema(document, "other.schema.json");
    const onOtherSchema = learnHeadsFromFiles([paths[1]], otherSchema, config, forests, {
      state: first.state,
      workers: 0,
    });
    await expect(onOtherSchema).rejects.toThrow(LeafcastError);
    await expect(onOtherSchema).rejects.toThrow(/cannot resume: schema fingerprint expected/);
    // The state is untouched by a refused resume.
    expect(first.state.rowCount).toBe(4000);
  }, 60_000);
});
