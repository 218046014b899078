import { mkdtemp, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import { resolveDatasetSchema } from "../../trainer/schema/load-dataset-schema.js";
import { resolveTrainingConfig } from "../../trainer/schema/load-training-config.js";
import { fitTreesFromFile } from "../../trainer/trees/fit-trees-from-file.js";
import { sigmoid, testRandom } from "./tree-test-helpers.js";

describe("fitTreesFromFile", () => {
  let dir = "";
  let csv = "";
  const schema = resolveDatasetSchema({
    name: "plots",
    columns: [
      { name: "shown_at", role: "timestamp", timeUnit: "s" },
      { name: "tie_strength", role: "numeric" },
      { name: "post_type", role: "categorical" },
      { name: "open", role: "outcome" },
      { name: "save", role: "outcome" },
    ],
  });

  beforeAll(async () => {
    dir = await mkdtemp(join(tmpdir(), "leafcast-fit-trees-"));
    csv = join(dir, "plots.csv");
    const random = testRandom(8);
    const types = ["tip", "question", "swap_offer"];
    const lines = ["shown_at,tie_strength,post_type,open,save"];
    for (let r = 0; r < 1000; r++) {
      const tie = random();
      const type = Math.floor(random() * 3);
      const open = random() < sigmoid(3 * tie - 1.5 + (type === 1 ? 1 : 0)) ? 1 : 0;
      const save = random() < 0.01 ? 1 : 0;
      const tieText = r % 17 === 0 ? "" : tie.toFixed(3);
      lines.push(`${1_700_000_000 + r},${tieText},${types[type]},${open},${save}`);
    }
    await writeFile(csv, `${lines.join("\n")}\n`);
  });
  afterAll(async () => {
    await rm(dir, { recursive: true, force: true });
  });

  it("samples rows, picks the frequent outcomes and fits a forest for each", async () => {
    const config = resolveTrainingConfig({
      seed: 3,
      workers: 1,
      trees: { count: 5, depth: 3, bins: 32, sampleRows: 800, minForestRate: 0.05 },
    });
    const result = await fitTreesFromFile(csv, schema, config);
    expect(result.rowsRead).toBe(1000);
    expect(result.rowsSampled).toBe(800);
    expect(result.positiveRate.get("save")).toBeLessThan(0.05);
    expect(result.forests.forests.map((f) => f.forest.outcome)).toEqual(["open"]);
    expect(result.forests.contract.numeric).toEqual(["tie_strength"]);
    expect([...result.forests.contract.categorical[0].values].sort()).toEqual([
      "question",
      "swap_offer",
      "tip",
    ]);
    const open = result.forests.forests[0];
    expect(open.forest.trees.length).toBeGreaterThan(0);
    expect(open.importance.find((i) => i.feature === "tie_strength")?.splits).toBeGreaterThan(0);
  });

  it("fits the outcomes the configuration names, and says why when none qualifies", async () => {
    const named = resolveTrainingConfig({
      workers: 1,
      trees: { count: 2, depth: 2, outcomes: ["save"] },
    });
    const result = await fitTreesFromFile(csv, schema, named);
    expect(result.forests.forests.map((f) => f.forest.outcome)).toEqual(["save"]);
    const strict = resolveTrainingConfig({ workers: 1, trees: { count: 2, minForestRate: 0.9 } });
    await expect(fitTreesFromFile(csv, schema, strict)).rejects.toThrow(LeafcastError);
    await expect(fitTreesFromFile(csv, schema, strict)).rejects.toThrow(
      /expected an outcome with a positive rate of at least 0.9 \(trees.minForestRate\), found open 0\.\d+, save 0\.\d+/,
    );
  });
});
