// Property-based hostile-input tests of the NDJSON reader: every generated or
// damaged file must end in batches equal to an independent oracle's reading
// (ndjson-oracle.ts: JSON.parse per line plus the documented cell rules) or in
// the tool's own LeafcastError, under both bad-row policies.
import { rmSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import fc from "fast-check";
import { afterAll, describe, expect, it } from "vitest";
import { mutate } from "./byte-mutations.js";
import { checkReadAgainstOracle } from "./check-read-against-oracle.js";
import { fuzzParams } from "./fuzz-params.js";
import { ndjsonOracle } from "./ndjson-oracle.js";
import { scratchDir } from "./scratch-dir.js";
import { layoutArb, ndjsonText, readOptionsArb, tableArb } from "./text-file-cases.js";

const dir = scratchDir("leafcast-hostile-ndjson-");
const path = join(dir, "plots.ndjson");
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Generated cases per property (the closing note of issue 7 quotes them). */
const NDJSON_RUNS = { wellFormed: 1000, damaged: 2000 };

describe("NDJSON reader on hostile input", () => {
  it(`matches the oracle on ${NDJSON_RUNS.wellFormed} generated files of hostile values`, async () => {
    await fc.assert(
      fc.asyncProperty(tableArb, layoutArb, readOptionsArb, async (table, layout, options) => {
        const bytes = Buffer.from(ndjsonText(table, layout), "utf8");
        writeFileSync(path, bytes);
        await checkReadAgainstOracle(path, ndjsonOracle(bytes), options, dir);
      }),
      fuzzParams(NDJSON_RUNS.wellFormed),
    );
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });

  it(`matches the oracle or refuses with a LeafcastError on ${NDJSON_RUNS.damaged} byte-damaged files`, async () => {
    await fc.assert(
      fc.asyncProperty(tableArb, layoutArb, readOptionsArb, async (table, layout, options) => {
        const bytes = mutate(Buffer.from(ndjsonText(table, layout), "utf8"), layout.mutations);
        writeFileSync(path, bytes);
        await checkReadAgainstOracle(path, ndjsonOracle(bytes), options, dir);
      }),
      fuzzParams(NDJSON_RUNS.damaged),
    );
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });
});
