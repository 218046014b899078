// Property-based hostile-input tests of the CSV reader: every generated or
// damaged file must end in batches equal to an independent oracle's reading
// (csv-oracle.ts) or in the tool's own LeafcastError, under both bad-row policies.
import { rmSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import fc from "fast-check";
import { afterAll, describe, it } from "vitest";
import { mutate } from "./byte-mutations.js";
import { checkReadAgainstOracle } from "./check-read-against-oracle.js";
import { csvOracle } from "./csv-oracle.js";
import { fuzzParams } from "./fuzz-params.js";
import { scratchDir } from "./scratch-dir.js";
import { csvText, layoutArb, readOptionsArb, tableArb } from "./text-file-cases.js";

const dir = scratchDir("leafcast-hostile-csv-");
const path = join(dir, "plots.csv");
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Generated cases per property (the closing note of issue 7 quotes them). */
const CSV_RUNS = { wellFormed: 1000, damaged: 2000 };

describe("CSV reader on hostile input", () => {
  it(`matches the oracle on ${CSV_RUNS.wellFormed} generated files of hostile cell texts`, async () => {
    await fc.assert(
      fc.asyncProperty(tableArb, layoutArb, readOptionsArb, async (table, layout, options) => {
        const bytes = Buffer.from(csvText(table, layout), "utf8");
        writeFileSync(path, bytes);
        await checkReadAgainstOracle(path, csvOracle(bytes), options, dir);
      }),
      fuzzParams(CSV_RUNS.wellFormed),
    );
  });

  it(`matches the oracle or refuses with a LeafcastError on ${CSV_RUNS.damaged} byte-damaged files`, async () => {
    await fc.assert(
      fc.asyncProperty(tableArb, layoutArb, readOptionsArb, async (table, layout, options) => {
        const bytes = mutate(Buffer.from(csvText(table, layout), "utf8"), layout.mutations);
        writeFileSync(path, bytes);
        await checkReadAgainstOracle(path, csvOracle(bytes), options, dir);
      }),
      fuzzParams(CSV_RUNS.damaged),
    );
  });
});
