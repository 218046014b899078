import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import { resolveTrainingConfig } from "../../trainer/schema/load-training-config.js";
import { binFeatures } from "../../trainer/trees/bin-features.js";
import { fitForests } from "../../trainer/trees/fit-forests.js";
import { forestFileOf } from "../../trainer/trees/forest-file.js";
import { readForestFile } from "../../trainer/trees/read-forest-file.js";
import { writeForestFile } from "../../trainer/trees/write-forest-file.js";
import { mixedData } from "./tree-test-helpers.js";

describe("forest files", () => {
  let dir = "";
  beforeAll(async () => {
    dir = await mkdtemp(join(tmpdir(), "leafcast-forests-"));
  });
  afterAll(async () => {
    await rm(dir, { recursive: true, force: true });
  });

  const config = resolveTrainingConfig({
    seed: 4,
    trees: {
      count: 6,
      depth: 3,
      bins: 32,
      learningRate: 0.3,
      validationFraction: 0.2,
      patience: 2,
    },
  });
  const data = mixedData(5, 2000);
  const binned = binFeatures(
    { rowCount: data.rows, numeric: data.numeric, categorical: data.categorical },
    {
      bins: config.trees.bins,
      binSampleRows: config.trees.binSampleRows,
      maxCategories: config.trees.maxCategories,
      seed: 4,
    },
  );

  it("round-trip every number and the contract", async () => {
    const fitted = await fitForests(
      binned,
      [
        { outcome: "open", label: data.label },
        { outcome: "hide", label: data.label.map((y) => 1 - y) },
      ],
      { settings: config.trees, seed: config.seed, workers: 1 },
    );
    const file = forestFileOf(binned, fitted, config.trees, config.seed);
    const path = join(dir, "forests.json");
    await writeForestFile(path, file);
    const loaded = await readForestFile(path);
    expect(loaded.seed).toBe(4);
    expect(loaded.settings).toEqual(config.trees);
    expect(loaded.contract).toEqual(binned.contract);
    expect([...loaded.binEdges.keys()]).toEqual(["x0", "x1", "x2"]);
    expect(loaded.binEdges.get("x1")).toEqual(binned.edges[1]);
    expect(loaded.forests).toHaveLength(2);
    loaded.forests.forEach((record, f) => {
      const { scores: _scores, ...original } = fitted[f];
      expect(record).toEqual(original); // typed arrays compare by content, numbers exactly
    });
    expect(
      (await readFile(path, "utf8")).startsWith('{"format":"leafcast-forests","version":1,'),
    ).toBe(true);
  });

  it("reject a damaged file with every problem named", async () => {
    const fitted = await fitForests(binned, [{ outcome: "open", label: data.label }], {
      settings: config.trees,
      seed: config.seed,
      workers: 1,
    });
    const path = join(dir, "damaged.json");
    await writeForestFile(path, forestFileOf(binned, fitted, config.trees, config.seed));
    const document = JSON.parse(await readFile(path, "utf8")) as {
      forests: { trees: { feature: number[]; leafValue: number[] }[] }[];
    };
    document.forests[0].trees[0].feature[0] = 99;
    document.forests[0].trees[0].leafValue.pop();
    await writeFile(path, JSON.stringify(document));
    const load = readForestFile(path);
    await expect(load).rejects.toBeInstanceOf(LeafcastError);
    await expect(load).rejects.toThrow(
      "forests: /forests/0/trees/0/leafValue: expected 8 entries, found 7",
    );
    await expect(load).rejects.toThrow(
      "/forests/0/trees/0/feature/0: expected a feature index below 5, found 99",
    );
    await writeFile(path, '{"format":"something else"}');
    await expect(readForestFile(path)).rejects.toThrow(
      /forests: \/format: expected "leafcast-forests"/,
    );
  });
});
