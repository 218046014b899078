import { describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import { resolveDatasetSchema } from "../../trainer/schema/load-dataset-schema.js";
import {
  resolveTrainingConfig,
  checkConfigAgainstSchema,
} from "../../trainer/schema/load-training-config.js";

const plotlineLike = {
  name: "plotline-mini",
  columns: [
    { name: "tie_strength", role: "numeric" },
    { name: "post_type", role: "categorical" },
    { name: "ts", role: "timestamp" },
    { name: "open", role: "outcome" },
    { name: "true_open", role: "true_probability", outcome: "open" },
    { name: "viewer_id", role: "group" },
  ],
};

function issuesOf(fn: () => unknown): string[] {
  try {
    fn();
  } catch (error) {
    if (error instanceof LeafcastError) return error.issues.map((i) => `${i.code}: ${i.message}`);
    throw error;
  }
  return [];
}

describe("resolveDatasetSchema", () => {
  it("groups columns by role and fills defaults", () => {
    const schema = resolveDatasetSchema(plotlineLike, "mini.json");
    expect(schema.numeric).toEqual(["tie_strength"]);
    expect(schema.categorical).toEqual(["post_type"]);
    expect(schema.outcomes).toEqual(["open"]);
    expect(schema.timestamp).toBe("ts");
    expect(schema.groups).toEqual(["viewer_id"]);
    expect(schema.trueProbability.get("open")).toBe("true_open");
    const tie = schema.byName.get("tie_strength");
    expect(tie?.allowMissing).toBe(true);
    expect(tie?.missing.has("")).toBe(true);
    expect(schema.byName.get("open")?.allowMissing).toBe(false);
  });

  it("names the field and the reason for an invalid document", () => {
    const bad = { name: "x", columns: [{ name: "a", role: "numerc" }] };
    const issues = issuesOf(() => resolveDatasetSchema(bad, "bad.json"));
    expect(issues[0]).toMatch(
      /^enum: \/columns\/0\/role: expected one of .*"numeric".*found "numerc"/,
    );
  });

  it("refuses duplicate columns, two timestamps, a dangling true probability, no outcome", () => {
    const bad = {
      name: "x",
      columns: [
        { name: "a", role: "numeric" },
        { name: "a", role: "numeric" },
        { name: "t1", role: "timestamp" },
        { name: "t2", role: "timestamp" },
        { name: "p", role: "true_probability", outcome: "a" },
      ],
    };
    const codes = issuesOf(() => resolveDatasetSchema(bad))
      .map((i) => i.split(":")[0])
      .sort();
    expect(codes).toEqual(["duplicate_column", "duplicate_role", "no_outcome", "unknown_outcome"]);
  });
});

describe("resolveTrainingConfig", () => {
  it("fills every default for an empty document", () => {
    const config = resolveTrainingConfig({});
    expect(config.trees.depth).toBe(6);
    expect(config.trees.leaves).toBe(64);
    expect(config.heads.beta).toBe(1); // "beta = 1 is usually good enough" (McMahan et al. 2013)
    expect(config.workers).toBeGreaterThanOrEqual(1);
  });

  it("refuses unknown fields and out-of-range values, naming them", () => {
    const issues = issuesOf(() =>
      resolveTrainingConfig({ trees: { depth: 40, deepness: 2 }, heads: { alpha: 0 } }, "c.json"),
    );
    expect(issues).toEqual([
      "maximum: /trees/depth: expected a number <= 16, found 40",
      'additionalProperties: /trees/deepness: unknown field "deepness"',
      "exclusiveMinimum: /heads/alpha: expected a number > 0, found 0",
    ]);
  });

  it("checks the columns it names against the dataset schema", () => {
    const schema = resolveDatasetSchema(plotlineLike);
    const config = resolveTrainingConfig({ heads: { hashed: ["post_type", "tie_strength"] } });
    const issues = issuesOf(() => checkConfigAgainstSchema(config, schema));
    expect(issues).toHaveLength(1);
    expect(issues[0]).toContain('"tie_strength" to be a categorical column');
  });
});
