import { readFileSync } from "node:fs";
import { rm } from "node:fs/promises";
import { join } from "node:path";
import { Ajv2020 } from "ajv/dist/2020.js";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openDataFile } from "../../trainer/data/open-data-file.js";
import { pruneFeatures, type PruneFeaturesResult } from "../../trainer/pruning/prune-features.js";
import { writeReducedSchema } from "../../trainer/pruning/write-reduced-schema.js";
import { renderReport } from "../../trainer/report/render-report.js";
import { pruningReportInput } from "../../trainer/pruning/pruning-report-input.js";
import {
  loadDatasetSchema,
  resolveDatasetSchema,
  type ResolvedSchema,
} from "../../trainer/schema/load-dataset-schema.js";
import { resolveTrainingConfig } from "../../trainer/schema/load-training-config.js";
import {
  NOISE_FEATURES,
  pruningSchemaDocument,
  REAL_FEATURES,
  writePruningFixture,
} from "./pruning-fixture.js";

// Ground truth from the generator (datasets/plotline/fill-plotline-probabilities.ts):
// `open` depends on tie strength, post age, feed position, hour of day and post type,
// and on none of the invented noise columns (uniform draws added by the fixture). The
// loop should drop the noise first without moving held-out NE, then stop when a real
// feature goes. 24,000 rows (four days), the latest 20 % held out by time; 30 trees of
// depth 4 on 32 bins keep the whole file near 2 s of CPU.
const config = resolveTrainingConfig({
  seed: 3,
  workers: 1,
  trees: { count: 30, depth: 4, bins: 32, outcomes: ["open"] },
});
/**
 * Measured with this data: the three noise drops moved held-out NE of open by
 * -0.06 %, -0.25 % and -0.02 % against every feature; dropping hour_of_day next
 * made it 0.46 % worse. Noise steps are held to 0.3 %.
 */
const NOISE_STEP_MOVE = 0.003;

let dir = "";
let path = "";
let schema: ResolvedSchema;
let result: PruneFeaturesResult;

beforeAll(async () => {
  ({ dir, path } = await writePruningFixture());
  schema = resolveDatasetSchema(pruningSchemaDocument());
  result = await pruneFeatures([path], schema, config, { minFeatures: 1, neTolerance: 0.002 });
}, 60_000);
afterAll(() => rm(dir, { recursive: true, force: true }));

describe("pruneFeatures on a Plotline sample with noise columns", () => {
  it("drops the noise columns first, one per step, with held-out NE barely moving", () => {
    expect(result.heldOutBy).toBe("time");
    expect(result.trainRows + result.heldOutRows).toBe(24_000);
    expect(result.heldOutRows).toBe(4800);
    expect(result.candidates).toHaveLength(REAL_FEATURES.length + NOISE_FEATURES.length);
    const [all, ...rest] = result.steps;
    expect(all.featuresKept).toBe(8);
    expect(all.dropped).toEqual([]);
    const noiseSteps = rest.slice(0, 3);
    expect(noiseSteps.flatMap((s) => s.dropped).sort()).toEqual([...NOISE_FEATURES].sort());
    for (const step of noiseSteps) {
      expect(step.accepted).toBe(true);
      expect(Math.abs(step.heldOutNe.open / all.heldOutNe.open - 1)).toBeLessThan(NOISE_STEP_MOVE);
    }
    // NE below 1: the forest beats the training positive rate (He et al. 2014's NE).
    expect(all.heldOutNe.open).toBeLessThan(1);
  });

  it("stops at the first real feature whose loss passes the tolerance, and undoes that drop", () => {
    expect(result.stopReason).toBe("ne_tolerance");
    const rejected = result.steps[result.steps.length - 1];
    expect(rejected.accepted).toBe(false);
    expect(rejected.dropped).toHaveLength(1);
    expect(REAL_FEATURES as readonly string[]).toContain(rejected.dropped[0]);
    expect(rejected.heldOutNe.open).toBeGreaterThan(result.steps[0].heldOutNe.open * 1.002);
    expect([...result.dropped].sort()).toEqual([...NOISE_FEATURES].sort());
    expect([...result.kept].sort()).toEqual([...REAL_FEATURES].sort());
  });

  it("loses NE clearly once real features go (no tolerance, two per step)", async () => {
    const deep = await pruneFeatures([path], schema, config, {
      minFeatures: 2,
      dropPerStep: 2,
      neTolerance: 10,
    });
    expect(deep.steps.map((s) => s.featuresKept)).toEqual([8, 6, 4, 2]);
    expect(deep.stopReason).toBe("min_features");
    const first = deep.steps[0].heldOutNe.open;
    const last = deep.steps[deep.steps.length - 1].heldOutNe.open;
    // Measured: 2 features left (of tie strength, post age, feed position) cost ~2 % NE.
    expect(last / first - 1).toBeGreaterThan(0.01);
    expect(deep.dropped.slice(0, 3).sort()).toEqual([...NOISE_FEATURES].sort());
  }, 60_000);

  it("writes a reduced schema that validates, loads and reads with the noise ignored", async () => {
    const out = join(dir, "pruned.schema.json");
    await writeReducedSchema(out, schema, result.dropped);
    const written: unknown = JSON.parse(readFileSync(out, "utf8"));
    // Checked by ajv, an independent JSON Schema validator, against schemas/dataset.schema.json.
    const ajv = new Ajv2020({ strict: false, allErrors: true });
    const validate = ajv.compile(JSON.parse(readFileSync("schemas/dataset.schema.json", "utf8")));
    expect(validate(written), JSON.stringify(validate.errors)).toBe(true);

    const reduced = await loadDatasetSchema(out);
    const original = pruningSchemaDocument() as { columns: { name: string; role: string }[] };
    expect(reduced.document.columns.map((c) => c.name)).toEqual(
      original.columns.map((c) => c.name),
    );
    for (const column of original.columns) {
      const role = reduced.byName.get(column.name)?.role;
      expect(role).toBe(
        (NOISE_FEATURES as readonly string[]).includes(column.name) ? "ignore" : column.role,
      );
    }
    expect(reduced.document.columns.find((c) => c.name === "noise_a")?.description).toBe(
      "invented noise",
    );
    expect([...reduced.numeric].sort()).toEqual(
      REAL_FEATURES.filter((f) => f !== "post_type").sort(),
    );
    const reader = openDataFile(path, reduced, { batchRows: 4096 });
    for await (const batch of reader.batches()) {
      for (const name of NOISE_FEATURES) expect(batch.columns.has(name)).toBe(false);
      expect(batch.columns.has("tie_strength")).toBe(true);
      break;
    }
  });

  it("refuses to drop a column that is not a feature, naming it", async () => {
    const out = join(dir, "refused.schema.json");
    await expect(writeReducedSchema(out, schema, ["open", "no_such"])).rejects.toThrow(
      /"open" to be a numeric or categorical column .* found role "outcome"[\s\S]*"no_such"/,
    );
  });

  it("renders the importance bars and the pruning chart", async () => {
    const html = await renderReport(pruningReportInput(result, { data: "plotline.parquet" }));
    expect(html).toContain('id="importance"');
    expect(html).toContain('id="pruning"');
    expect((html.match(/<svg/g) ?? []).length).toBeGreaterThanOrEqual(2);
    expect(html).toContain("hour_of_day (not kept)");
  });
});
