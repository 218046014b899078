import { mkdtemp, readdir, readFile, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import Ajv2020 from "ajv/dist/2020.js";
import { afterAll, describe, expect, it } from "vitest";
import { artifactSchemaDocument } from "../../scorer/artifact.generated.js";
import { artifactChecksum } from "../../scorer/artifact-checksum.js";
import { checkArtifact } from "../../scorer/check-artifact.js";
import { modelFromArtifact } from "../../scorer/model-from-artifact.js";
import { buildArtifact } from "../../trainer/artifact/build-artifact.js";
import { describeArtifact } from "../../trainer/artifact/describe-artifact.js";
import { exportArtifact } from "../../trainer/artifact/export-artifact.js";
import { formatArtifactDescription } from "../../trainer/artifact/format-artifact-description.js";
import { formatArtifactText } from "../../trainer/artifact/format-artifact-text.js";
import { syntheticModel } from "../../trainer/artifact/synthetic-model.js";
import { benchArtifact, smallModel } from "./fixtures.js";

const dirs: string[] = [];
afterAll(async () => {
  for (const dir of dirs) await rm(dir, { recursive: true, force: true });
});

describe("artifact export", () => {
  it("the 100-tree, depth-6, six-head artifact stays under 1 MB, with no object per node", () => {
    const artifact = benchArtifact();
    const bytes = new TextEncoder().encode(formatArtifactText(artifact)).length;
    console.log(`scorer artifact, 100 trees of depth 6 and 6 heads: ${bytes} bytes`);
    expect(bytes).toBeLessThan(1_000_000);
    for (const forest of artifact.forests) {
      for (const field of [
        "feature",
        "threshold",
        "missingRight",
        "categorySplits",
        "leafValue",
      ] as const) {
        expect(forest[field].every((v) => typeof v === "number")).toBe(true);
      }
    }
  });

  it("stays under 1 MB even with every reachable leaf weighted in every head", () => {
    // FTRL's L1 step leaves unreached and weak leaves at zero; this is the case where it zeroes none.
    const dense = buildArtifact(
      syntheticModel({ trees: 100, depth: 6, leafDensity: 1, hashedPerHead: 400 }),
    );
    const bytes = new TextEncoder().encode(formatArtifactText(dense)).length;
    console.log(
      `scorer artifact, every reachable leaf weighted, 400 hashed weights per head: ${bytes} bytes`,
    );
    expect(bytes).toBeLessThan(1_000_000);
  });

  it("validates against the JSON Schema with ajv (an independent validator) too", () => {
    const ajv = new Ajv2020.default({ strict: false, allErrors: true });
    const validate = ajv.compile(artifactSchemaDocument);
    expect(validate(JSON.parse(formatArtifactText(buildArtifact(smallModel()))))).toBe(true);
    expect(validate({ format: "leafcast-scorer" })).toBe(false);
  });

  it("round-trips every double exactly and keeps the checksum independent of key order", () => {
    const model = smallModel();
    const artifact = buildArtifact(model);
    const parsed = JSON.parse(formatArtifactText(artifact)) as typeof artifact;
    expect(parsed).toEqual(artifact);
    const back = modelFromArtifact(checkArtifact(parsed));
    back.forests[0].trees.forEach((tree, t) => {
      expect(Array.from(tree.leafValue)).toEqual(Array.from(model.forests[0].trees[t].leafValue));
    });
    back.heads.forEach((head, h) => {
      const original = model.heads[h];
      const kept = Array.from(original.index).filter((_, i) => original.weight[i] !== 0);
      expect(Array.from(head.index)).toEqual(kept);
      expect(Array.from(head.weight)).toEqual(Array.from(original.weight).filter((w) => w !== 0));
    });
    const reordered = Object.fromEntries(Object.entries(parsed).reverse());
    expect(artifactChecksum(reordered)).toBe(artifact.checksum);
  });

  it("adds encoding-only columns to the contract and shifts tree feature indexes", () => {
    const model = smallModel();
    const numericCount = model.contract.numeric.length;
    // Drop the last numeric feature and the hashed-only categoricals from the contract:
    // the export must put them back (numerics first, so categorical indexes shift).
    const trimmed = {
      ...model,
      contract: {
        numeric: model.contract.numeric.filter((name) => name !== "post_age_hours"),
        categorical: model.contract.categorical.filter(
          (c) => c.name !== "crop" && c.name !== "viewer_region",
        ),
      },
      forests: model.forests.map((forest) => ({
        ...forest,
        trees: forest.trees.map((tree) => ({
          ...tree,
          feature: tree.feature.map((f) => (f === 1 ? 0 : f > 1 ? f - 1 : f)),
        })),
      })),
    };
    const artifact = buildArtifact(trimmed);
    expect(artifact.contract.numeric).toEqual([...trimmed.contract.numeric, "post_age_hours"]);
    expect(artifact.contract.categorical.map((c) => c.name)).toEqual([
      "post_kind",
      "season",
      "soil",
      "crop",
      "viewer_region",
    ]);
    const categoricalNodes = artifact.forests[0].feature.filter((f) => f >= numericCount).length;
    expect(categoricalNodes).toBeGreaterThan(0);
    const original = model.forests[0].trees
      .flatMap((tree) => Array.from(tree.feature))
      .filter((f) => f >= numericCount).length;
    expect(categoricalNodes).toBe(original);
  });

  it("refuses a broken model with a LeafcastError naming every problem", () => {
    const model = smallModel();
    model.heads[0].weight[0] = NaN;
    model.forests[0].trees[1].feature[0] = 40;
    expect(() => buildArtifact(model)).toThrow(
      /artifact: \/forests\/0\/feature\/15: expected a feature index in \[-1, 17\), found 40\nartifact: \/heads\/0\/weight\/0: expected a finite number, found NaN/,
    );
  });

  it("writes atomically and describes itself", async () => {
    const dir = await mkdtemp(join(tmpdir(), "leafcast-artifact-"));
    dirs.push(dir);
    const path = join(dir, "plotline.model.json");
    const written = await exportArtifact(path, {
      ...smallModel(),
      provenance: {
        name: "plotline-small",
        dataWindows: [
          {
            stage: "trees",
            files: ["impressions-2025-02.csv"],
            rows: 120_000,
            from: new Date("2025-02-01T00:00:00Z"),
            to: "2025-02-28T23:59:59Z",
          },
        ],
        metrics: { open: { normalizedEntropy: 0.91, auc: 0.74, calibration: NaN } },
        createdAt: new Date("2025-03-01T06:00:00Z"),
      },
    });
    expect(await readdir(dir)).toEqual(["plotline.model.json"]);
    const text = await readFile(path, "utf8");
    expect(written.bytes).toBe(Buffer.byteLength(text));
    const artifact = checkArtifact(JSON.parse(text));
    expect(artifact.checksum).toBe(written.checksum);
    expect(artifact.provenance.metrics.open).toEqual({ normalizedEntropy: 0.91, auc: 0.74 });
    expect(artifact.provenance.dataWindows[0].from).toBe("2025-02-01T00:00:00.000Z");
    const description = describeArtifact(artifact);
    expect(description.bytes).toBe(written.bytes);
    expect(description.forests[0].trees).toBe(20);
    expect(description.heads.map((h) => h.outcome)).toEqual([
      "open",
      "react",
      "reply",
      "save",
      "reshare",
      "hide",
    ]);
    for (const head of description.heads)
      expect(head.leafWeights + head.hashedWeights + head.numericWeights).toBe(head.nonZero);
    expect(description.topFeatures.length).toBeGreaterThan(0);
    expect(description.topFeatures[0].splits).toBeGreaterThanOrEqual(
      description.topFeatures[1].splits,
    );
    const printed = formatArtifactDescription(description);
    expect(printed).toContain("artifact: format version 1");
    expect(printed).toContain("open: ");
  });
});
