import { describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import { loadDatasetSchema } from "../../trainer/schema/load-dataset-schema.js";
import { resolveTrainingConfig } from "../../trainer/schema/load-training-config.js";
import { runFreshnessStudy } from "../../trainer/study/run-freshness-study.js";

// Hand-made case: a drift day past the start of the last window leaves no window
// to average, and must be refused before any file is read (the files here do
// not exist, so reading one would fail differently).
describe("runFreshnessStudy options", () => {
  it("refuses a drift day after the last window starts, before reading", async () => {
    const schema = await loadDatasetSchema("datasets/plotline.schema.json");
    const days = Array.from({ length: 6 }, (_, d) => `/nonexistent/day-0${d + 1}.csv`);
    const error = await runFreshnessStudy(days, schema, resolveTrainingConfig({}), {
      fitDays: 2,
      windowDays: 2,
      driftFromDay: 6,
    }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(LeafcastError);
    expect((error as LeafcastError).message).toContain(
      "drift day expected at most 5 (the first day of the last scored window), found 6",
    );
  });
});
