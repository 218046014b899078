import { writeFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import { resolveDatasetSchema } from "../../trainer/schema/load-dataset-schema.js";
import { expectBadRows, readAll, tempDir } from "./expect-bad-rows.js";

const schema = resolveDatasetSchema({
  name: "ndjson-test",
  columns: [
    { name: "tie_strength", role: "numeric" },
    { name: "crop", role: "categorical" },
    { name: "open", role: "outcome" },
    { name: "weight", role: "weight", required: false },
  ],
});

function ndjsonFile(lines: string[]): string {
  const path = join(tempDir(), "plots.ndjson");
  writeFileSync(path, lines.join("\n"));
  return path;
}

describe("readNdjson", () => {
  it("rejects an invalid JSON line with its line number", async () => {
    const path = ndjsonFile([
      '{"tie_strength":1,"crop":"a","open":1}',
      '{"tie_strength":2,"crop":"b","open":0',
      "",
      '{"tie_strength":3,"crop":"c","open":1}',
      "[1,2]",
      '{"tie_strength":4,"crop":"d","open":0}',
    ]);
    const got = await expectBadRows(
      path,
      schema,
      [
        { row: 2, column: null, code: "invalid_json" },
        { row: 5, column: null, code: "not_an_object" },
      ],
      3,
    );
    expect(got.columns.tie_strength.values).toEqual([1, 3, 4]);
    const error = await readAll(path, schema).catch((e: unknown) => e);
    expect(String(error)).toMatch(
      /^LeafcastError: ndjson: expected a JSON object, found invalid JSON \(.+\) \(.+plots\.ndjson row 2\)$/,
    );
  });

  it("rejects wrong types, text that is not a number and non-finite numbers", async () => {
    const path = ndjsonFile([
      '{"tie_strength":{"x":1},"crop":"a","open":1}',
      '{"tie_strength":"n/a","crop":"a","open":1}',
      '{"tie_strength":true,"crop":"a","open":1}',
      '{"tie_strength":"2.5","crop":7,"open":true}',
      '{"tie_strength":1e999,"crop":"a","open":1}',
      '{"tie_strength":1,"crop":["a"],"open":1}',
      '{"tie_strength":1,"crop":"a","open":2}',
      '{"tie_strength":1,"crop":"a","open":"yes"}',
      '{"tie_strength":null,"crop":null,"open":0}',
      '{"tie_strength":1,"crop":"a","open":null}',
      '{"tie_strength":3,"crop":"b","open":0,"weight":-1}',
    ]);
    const got = await expectBadRows(
      path,
      schema,
      [
        { row: 1, column: "tie_strength", code: "wrong_type" },
        { row: 2, column: "tie_strength", code: "not_a_number" },
        { row: 3, column: "tie_strength", code: "wrong_type" },
        { row: 5, column: "tie_strength", code: "not_finite" },
        { row: 6, column: "crop", code: "wrong_type" },
        { row: 7, column: "open", code: "not_a_label" },
        { row: 8, column: "open", code: "not_a_label" },
        { row: 10, column: "open", code: "missing_value" },
      ],
      3,
    );
    // A number in a categorical column becomes its decimal text; null is missing.
    expect(got.columns.crop.values).toEqual(["7", null, "b"]);
    expect(got.columns.tie_strength.values).toEqual([2.5, null, 3]);
    expect(got.columns.open.values).toEqual([1, 0, 0]);
    // The optional weight column is absent from the first object, so (like a column missing
    // from a CSV header) it is not part of this file, and row 11's weight is not read.
    expect(Object.keys(got.columns)).toEqual(["tie_strength", "crop", "open"]);
  });

  it("names the column in type errors", async () => {
    const path = ndjsonFile(['{"tie_strength":{"x":1},"crop":"a","open":1}']);
    const error = await readAll(path, schema).catch((e: unknown) => e);
    expect(String(error)).toBe(
      `LeafcastError: ndjson: column "tie_strength" expected a number, found an object {"x":1} (${path} row 1)`,
    );
  });

  it("refuses a file whose first object lacks a required column", async () => {
    const error = await readAll(ndjsonFile(['{"tie_strength":1,"crop":"a"}']), schema, {
      badRows: "skip",
    }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(LeafcastError);
    expect((error as LeafcastError).issues[0]).toMatchObject({
      code: "missing_column",
      column: "open",
    });
  });

  it("says 'empty file' for a file without objects", async () => {
    for (const lines of [[], ["", "  ", ""]]) {
      const path = ndjsonFile(lines);
      const error = await readAll(path, schema).catch((e: unknown) => e);
      expect(String(error)).toBe(
        `LeafcastError: ndjson: expected JSON objects, found an empty file (${path})`,
      );
    }
  });

  it("reads lines cut across chunks, with a BOM and CRLF", async () => {
    const lines = Array.from(
      { length: 50 },
      (_, i) => `{"tie_strength":${i / 4},"crop":"c${i % 3}","open":${i % 2}}\r`,
    );
    const path = join(tempDir(), "cut.jsonl");
    writeFileSync(path, "\ufeff" + lines.join("\n"));
    for (const chunkBytes of [1, 5, 64]) {
      const got = await readAll(path, schema, { chunkBytes, batchRows: 8 });
      expect(got.batchSizes).toEqual([8, 8, 8, 8, 8, 8, 2]);
      expect(got.columns.tie_strength.values).toEqual(lines.map((_, i) => i / 4));
      expect(got.columns.crop.values).toEqual(lines.map((_, i) => `c${i % 3}`));
    }
  });
});
