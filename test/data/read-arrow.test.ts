import { readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import {
  Float64,
  Int32,
  Table,
  Utf8,
  tableFromIPC,
  tableToIPC,
  vectorFromArray,
} from "apache-arrow";
import { describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import { openDataFile } from "../../trainer/data/open-data-file.js";
import { resolveDatasetSchema } from "../../trainer/schema/load-dataset-schema.js";
import { expectBadRows, readAll, tempDir } from "./expect-bad-rows.js";

const fixtures = join(import.meta.dirname, "../fixtures/readers");
const goldenSchema = resolveDatasetSchema(
  JSON.parse(readFileSync(join(fixtures, "golden.schema.json"), "utf8")),
);

const schema = resolveDatasetSchema({
  name: "arrow-test",
  columns: [
    { name: "tie_strength", role: "numeric" },
    { name: "crop", role: "categorical" },
    { name: "open", role: "outcome" },
  ],
});

function badTable(): Table {
  return new Table({
    tie_strength: vectorFromArray(["1.5", "n/a", "2", "3", "Infinity"], new Utf8()),
    crop: vectorFromArray([1, 2, 1, null, 3], new Int32()),
    open: vectorFromArray([1, 0, 2, 1, 0], new Float64()),
  });
}

describe("readArrow", () => {
  for (const format of ["file", "stream"] as const) {
    it(`rejects bad cells row by row (${format} format)`, async () => {
      const path = join(tempDir(), format === "file" ? "plots.arrow" : "plots.arrows");
      writeFileSync(path, tableToIPC(badTable(), format));
      const got = await expectBadRows(
        path,
        schema,
        [
          { row: 2, column: "tie_strength", code: "not_a_number" },
          { row: 3, column: "open", code: "not_a_label" },
          { row: 5, column: "tie_strength", code: "not_finite" },
        ],
        2,
      );
      expect(got.columns.tie_strength.values).toEqual([1.5, 3]);
      // Integers in a categorical column become their decimal text; a null is missing.
      expect(got.columns.crop.values).toEqual(["1", null]);
      expect(got.columns.open.values).toEqual([1, 1]);
    });
  }

  it("refuses a file without a required column", async () => {
    const path = join(tempDir(), "plots.arrow");
    writeFileSync(
      path,
      tableToIPC(new Table({ crop: vectorFromArray(["a"], new Utf8()) }), "file"),
    );
    const error = await readAll(path, schema, { badRows: "skip" }).catch((e: unknown) => e);
    expect((error as LeafcastError).issues.map((i) => i.column)).toEqual(["tie_strength", "open"]);
    expect(String(error)).toContain(
      `arrow: column "tie_strength" is required by the schema, found no such column in the file (${path})`,
    );
  });

  for (const name of ["golden.arrow", "golden.arrows"]) {
    it(`says a truncated ${name} is truncated or damaged`, async () => {
      const bytes = readFileSync(join(fixtures, name));
      for (const length of [bytes.length - 12, Math.floor(bytes.length / 2), 200, 12, 3]) {
        const path = join(tempDir(), `cut-${name}`);
        writeFileSync(path, bytes.subarray(0, length));
        const error = await readAll(path, goldenSchema).catch((e: unknown) => e);
        expect(error, `${name} cut to ${length} bytes`).toBeInstanceOf(LeafcastError);
        expect((error as LeafcastError).code).toBe("damaged_file");
        expect(String(error)).toMatch(
          /^LeafcastError: arrow: file is truncated or damaged: .+ \(.+cut-golden\.arrows?\)$/,
        );
      }
    });
  }

  it("says 'empty file' for an empty file", async () => {
    const path = join(tempDir(), "empty.arrow");
    writeFileSync(path, "");
    const error = await readAll(path, goldenSchema).catch((e: unknown) => e);
    expect(String(error)).toBe(
      `LeafcastError: arrow: expected an Arrow IPC file, found an empty file (${path})`,
    );
  });

  it("reads the 200,000 flights of vega-datasets and finds the late-flight rate apache-arrow finds", async () => {
    // vega-datasets' flights-200k.arrow: real 2001 US flight records (delay and distance as Int16).
    const path = join(
      import.meta.dirname,
      "../../node_modules/vega-datasets/data/flights-200k.arrow",
    );
    const flights = resolveDatasetSchema({
      name: "flights",
      columns: [
        { name: "delay", role: "numeric" },
        { name: "distance", role: "numeric" },
        // Every dataset schema needs an outcome; this file has none, so it is optional.
        { name: "late", role: "outcome", required: false },
      ],
    });
    const reader = openDataFile(path, flights, { batchRows: 65536 });
    const sizes: number[] = [];
    let late = 0;
    let distance = 0;
    for await (const batch of reader.batches()) {
      sizes.push(batch.rowCount);
      const delay = batch.columns.get("delay");
      const miles = batch.columns.get("distance");
      if (delay?.kind !== "number" || miles?.kind !== "number")
        throw new Error("expected number columns");
      for (const d of delay.values) if (d >= 15) late++;
      for (const m of miles.values) distance += m;
      expect(batch.columns.has("late")).toBe(false);
    }
    expect(sizes).toEqual([65536, 65536, 65536, 200000 - 3 * 65536]);
    expect(reader.stats.rowsAccepted).toBe(200000);

    // Counted independently with apache-arrow's tableFromIPC. A flight is late at a delay of
    // 15 minutes or more (the usual on-time rule of US air travel statistics; common practice).
    const table = tableFromIPC(readFileSync(path));
    const delays = table.getChild("delay")?.toArray() as ArrayLike<number>;
    const miles = table.getChild("distance")?.toArray() as ArrayLike<number>;
    let expectedLate = 0;
    let expectedDistance = 0;
    for (let i = 0; i < table.numRows; i++) {
      if (delays[i] >= 15) expectedLate++;
      expectedDistance += miles[i];
    }
    expect(table.numRows).toBe(200000);
    expect(late / 200000).toBe(expectedLate / table.numRows);
    expect(distance).toBe(expectedDistance);
  });
});
