import { writeFileSync } from "node:fs";
import { join } from "node:path";
import {
  Bool,
  Dictionary,
  Float64,
  Int32,
  Table,
  Utf8,
  tableToIPC,
  vectorFromArray,
} from "apache-arrow";
import fc from "fast-check";
import { parquetWriteBuffer } from "hyparquet-writer";
import { describe, expect, it } from "vitest";
import { openDataFile } from "../../trainer/data/open-data-file.js";
import { resolveDatasetSchema } from "../../trainer/schema/load-dataset-schema.js";
import { collectBatches } from "./collect-batches.js";
import { tempDir } from "./expect-bad-rows.js";

// The columnar readers copy runs of clean rows in bulk and send other rows cell by
// cell; these properties check the mix against the cell rules restated plainly here.
const schema = resolveDatasetSchema({
  name: "feed-test",
  columns: [
    { name: "x", role: "numeric" },
    { name: "w", role: "weight" },
    { name: "crop", role: "categorical" },
    { name: "open", role: "outcome" },
  ],
});

interface Row {
  x: number | null;
  w: number | null;
  crop: string | null;
  open: boolean | null;
}

const rowArb = fc.record({
  x: fc.oneof(
    { weight: 8, arbitrary: fc.integer({ min: -5, max: 5 }).map((v) => v / 2) },
    { weight: 1, arbitrary: fc.constantFrom(null, Number.NaN, Infinity) },
  ),
  w: fc.oneof(
    { weight: 8, arbitrary: fc.constantFrom(0, 1, 2.5) },
    { weight: 1, arbitrary: fc.constantFrom(null, -1) },
  ),
  crop: fc.constantFrom("kale", "leek", "okra", null),
  open: fc.oneof(
    { weight: 9, arbitrary: fc.boolean() },
    { weight: 1, arbitrary: fc.constant(null) },
  ),
});

/** The expected code of a row's first bad cell, in schema order, or null for a good row. */
function problem(row: Row): string | null {
  if (row.x !== null && !Number.isFinite(row.x)) return "not_finite";
  if (row.w === null) return "missing_value";
  if (row.w < 0) return "negative_weight";
  if (row.open === null) return "missing_value";
  return null;
}

async function check(path: string, rows: Row[], batchRows: number): Promise<void> {
  const reader = openDataFile(path, schema, { badRows: "skip", batchRows });
  const got = await collectBatches(reader.batches());
  const good = rows.filter((row) => problem(row) === null);
  expect(got.rowCount).toBe(good.length);
  if (good.length > 0) {
    expect(got.columns.x.values).toEqual(good.map((r) => r.x));
    expect(got.columns.w.values).toEqual(good.map((r) => r.w));
    expect(got.columns.crop.values).toEqual(good.map((r) => r.crop));
    expect(got.columns.open.values).toEqual(good.map((r) => (r.open ? 1 : 0)));
  }
  const byCode: Record<string, number> = {};
  for (const row of rows) {
    const code = problem(row);
    if (code !== null) byCode[code] = (byCode[code] ?? 0) + 1;
  }
  expect(reader.stats.rejectedByCode).toEqual(byCode);
}

describe("columnar rows: bulk copy and row-by-row agree with the cell rules", () => {
  it("Arrow (dictionary and plain text, Bool labels, nulls)", async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(rowArb, { minLength: 1, maxLength: 120 }),
        fc.integer({ min: 1, max: 50 }),
        fc.boolean(),
        async (rows, batchRows, dictionary) => {
          const table = new Table({
            x: vectorFromArray(
              rows.map((r) => r.x),
              new Float64(),
            ),
            w: vectorFromArray(
              rows.map((r) => r.w),
              new Float64(),
            ),
            crop: dictionary
              ? vectorFromArray(
                  rows.map((r) => r.crop),
                  new Dictionary(new Utf8(), new Int32()),
                )
              : vectorFromArray(
                  rows.map((r) => r.crop),
                  new Utf8(),
                ),
            open: vectorFromArray(
              rows.map((r) => r.open),
              new Bool(),
            ),
          });
          const path = join(tempDir(), "rows.arrows");
          writeFileSync(path, tableToIPC(table, "stream"));
          await check(path, rows, batchRows);
        },
      ),
      { numRuns: 40 },
    );
  });

  it("Parquet (nullable columns as hyparquet decodes them)", async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(rowArb, { minLength: 1, maxLength: 120 }),
        fc.integer({ min: 1, max: 50 }),
        async (rows, batchRows) => {
          const buffer = parquetWriteBuffer({
            columnData: [
              { name: "x", data: rows.map((r) => r.x), type: "DOUBLE" },
              { name: "w", data: rows.map((r) => r.w), type: "DOUBLE" },
              { name: "crop", data: rows.map((r) => r.crop), type: "STRING" },
              { name: "open", data: rows.map((r) => r.open), type: "BOOLEAN" },
            ],
            rowGroupSize: 37,
          });
          const path = join(tempDir(), "rows.parquet");
          writeFileSync(path, new Uint8Array(buffer));
          await check(path, rows, batchRows);
        },
      ),
      { numRuns: 40 },
    );
  });
});
