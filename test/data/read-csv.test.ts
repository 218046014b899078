import { existsSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CategoryDictionary } from "../../trainer/data/category-dictionary.js";
import { LeafcastError } from "../../trainer/errors.js";
import { resolveDatasetSchema } from "../../trainer/schema/load-dataset-schema.js";
import { expectBadRows, readAll, tempDir } from "./expect-bad-rows.js";

const schema = resolveDatasetSchema({
  name: "csv-test",
  missing: ["", "NA"],
  columns: [
    { name: "tie_strength", role: "numeric" },
    { name: "crop", role: "categorical" },
    { name: "open", role: "outcome" },
    { name: "weight", role: "weight", required: false },
    { name: "open_p", role: "true_probability", outcome: "open", required: false },
    { name: "shown_at", role: "timestamp", timeUnit: "iso", required: false },
  ],
});

function csvFile(text: string, name = "plots.csv"): string {
  const path = join(tempDir(), name);
  writeFileSync(path, text);
  return path;
}

describe("readCsv bad rows", () => {
  it("rejects text in a numeric column, naming file, row and column", async () => {
    const path = csvFile(
      "tie_strength,crop,open\n1.5,tip,1\nn/a,swap,0\n2,tip,1\nabc,tip,0\n3,x,1\n",
    );
    const error = await readAll(path, schema).catch((e: unknown) => e);
    expect(String((error as LeafcastError).message)).toBe(
      `csv: column "tie_strength" expected a number, found "n/a" (${path} row 2)`,
    );
    const got = await expectBadRows(
      path,
      schema,
      [
        { row: 2, column: "tie_strength", code: "not_a_number" },
        { row: 4, column: "tie_strength", code: "not_a_number" },
      ],
      3,
    );
    expect(got.columns.tie_strength.values).toEqual([1.5, 2, 3]);
    expect(got.columns.crop.values).toEqual(["tip", "tip", "x"]);
  });

  it("rejects non-finite numbers instead of coercing them", async () => {
    const path = csvFile(
      "tie_strength,crop,open\nNaN,a,1\n1e-5,a,1\nInfinity,a,0\n-Infinity,a,0\n1e999,a,1\nNA,a,0\n  7 ,a,1\n-inf,a,1\n",
    );
    const got = await expectBadRows(
      path,
      schema,
      [1, 3, 4, 5, 8].map((row) => ({ row, column: "tie_strength", code: "not_finite" })),
      3,
    );
    // "NA" is a declared missing marker (NaN, read back as null); spaces around a number are allowed.
    expect(got.columns.tie_strength.values).toEqual([1e-5, null, 7]);
  });

  it("accepts only 0 and 1 as labels", async () => {
    const path = csvFile(
      "tie_strength,crop,open\n1,a,2\n1,a,yes\n1,a,-1\n1,a,0\n1,a,1\n1,a,true\n1,a,0.0\n1,a,1.0\n1,a,0.5\n1,a,\n",
    );
    const got = await expectBadRows(
      path,
      schema,
      [
        { row: 1, column: "open", code: "not_a_label" },
        { row: 2, column: "open", code: "not_a_label" },
        { row: 3, column: "open", code: "not_a_label" },
        { row: 9, column: "open", code: "not_a_label" },
        { row: 10, column: "open", code: "missing_value" },
      ],
      5,
    );
    expect(got.columns.open.values).toEqual([0, 1, 1, 0, 1]);
    const error = await readAll(path, schema).catch((e: unknown) => e);
    expect(String(error)).toContain('column "open" expected 0 or 1, found "2"');
  });

  it("checks weights, probabilities and ISO times by role", async () => {
    const path = csvFile(
      [
        "tie_strength,crop,open,weight,open_p,shown_at",
        "1,a,1,-0.5,0.5,2024-05-01T10:00:00Z",
        "1,a,1,1,1.5,2024-05-01T10:00:00Z",
        "1,a,1,,0.5,2024-05-01T10:00:00Z",
        "1,a,1,2,0.25,2024-02-30",
        "1,a,1,2,0.25,2024-05-01 12:00:00+02:00",
        "1,a,1,0,0,2024-05-01",
      ].join("\n"),
    );
    const got = await expectBadRows(
      path,
      schema,
      [
        { row: 1, column: "weight", code: "negative_weight" },
        { row: 2, column: "open_p", code: "out_of_range" },
        { row: 3, column: "weight", code: "missing_value" },
        { row: 4, column: "shown_at", code: "bad_time" },
      ],
      2,
    );
    // Epoch milliseconds of 2024-05-01T10:00:00Z and 2024-05-01T00:00:00Z (computed: 19844 days * 86400000).
    expect(got.columns.shown_at.values).toEqual([1714557600000, 1714521600000]);
    expect(got.columns.weight.values).toEqual([2, 0]);
  });

  it("rejects ragged rows but not quoted line breaks", async () => {
    const path = csvFile(
      'tie_strength,crop,open\n1,a,1\n2,a\n3,"multi\nline",0\n4,a,1,extra\n5,b,0',
    );
    const got = await expectBadRows(
      path,
      schema,
      [
        { row: 2, column: "open", code: "ragged_row" },
        { row: 4, column: null, code: "ragged_row" },
      ],
      3,
    );
    expect(got.columns.crop.values).toEqual(["a", "multi\nline", "b"]);
  });

  it("rejects text after a closing quote and an unclosed quote", async () => {
    const path = csvFile('tie_strength,crop,open\n1,"a"b,1\n2,c,0\n3,"never closed,1\n');
    await expectBadRows(
      path,
      schema,
      [
        { row: 1, column: "crop", code: "bad_quote" },
        { row: 3, column: "crop", code: "bad_quote" },
      ],
      1,
    );
  });

  it("takes a lone CR as a line end", async () => {
    const got = await readAll(csvFile("tie_strength,crop,open\r1,a,1\r2,b,0\r"), schema, {
      chunkBytes: 1,
    });
    expect(got.columns.tie_strength.values).toEqual([1, 2]);
  });

  it("counts blank lines in row numbers without reading them", async () => {
    const path = csvFile("tie_strength,crop,open\r\n1,a,1\r\n\r\n\nx,a,1\r\n");
    await expectBadRows(
      path,
      schema,
      [{ row: 4, column: "tie_strength", code: "not_a_number" }],
      1,
    );
  });
});

describe("readCsv file-level problems", () => {
  it("refuses a file without a required column, even when skipping bad rows", async () => {
    const path = csvFile("tie_strength,crop\n1,a\n");
    const rejectsPath = join(tempDir(), "rejects.ndjson");
    const error = await readAll(path, schema, { badRows: "skip", rejectsPath }).catch(
      (e: unknown) => e,
    );
    expect(error).toBeInstanceOf(LeafcastError);
    expect((error as LeafcastError).issues).toEqual([
      {
        code: "missing_column",
        message: 'column "open" is required by the schema, found no such column in the file',
        file: path,
        column: "open",
      },
    ]);
    expect(existsSync(rejectsPath)).toBe(false);
  });

  it("refuses a schema column named twice in the header", async () => {
    const error = await readAll(csvFile("open,tie_strength,crop,open\n1,1,a,1\n"), schema).catch(
      (e: unknown) => e,
    );
    expect((error as LeafcastError).code).toBe("duplicate_column");
  });

  it("says 'empty file' for a file without a header", async () => {
    for (const text of ["", "\ufeff"]) {
      const path = csvFile(text);
      const error = await readAll(path, schema).catch((e: unknown) => e);
      expect(String(error)).toBe(
        `LeafcastError: csv: expected a header row, found an empty file (${path})`,
      );
    }
  });

  it("yields no batches for a header without rows", async () => {
    for (const text of ["tie_strength,crop,open\n", "tie_strength,crop,open"]) {
      const got = await readAll(csvFile(text), schema);
      expect(got.batchSizes).toEqual([]);
    }
  });
});

describe("readCsv streaming", () => {
  // Rows with quoted fields holding commas, doubled quotes and CRLF/LF line breaks,
  // read with chunks so small that records, quotes and CRLF pairs are cut across reads.
  const rows = Array.from({ length: 300 }, (_, i) => ({
    tie: i % 7 === 0 ? -(i + 1) / 8 : i * 1.5,
    crop: i % 3 === 0 ? `bed ${i}, "north"\r\nrow ${i % 5}` : i % 3 === 1 ? `plain${i % 4}` : "",
    open: i % 2,
  }));
  const quote = (text: string): string => `"${text.replaceAll('"', '""')}"`;
  const text =
    "tie_strength,crop,open\r\n" +
    rows
      .map((r, i) => {
        const line = `${i % 4 === 0 ? quote(String(r.tie)) : r.tie},${quote(r.crop)},${r.open}`;
        return line + (i % 2 === 0 ? "\r\n" : "\n");
      })
      .join("");

  for (const chunkBytes of [1, 3, 17, 4096]) {
    it(`reads quoted fields across chunk boundaries (chunkBytes ${chunkBytes}, batchRows 7)`, async () => {
      const got = await readAll(csvFile(text), schema, { chunkBytes, batchRows: 7 });
      expect(got.rowCount).toBe(rows.length);
      expect(got.batchSizes.every((size, i, all) => size === 7 || i === all.length - 1)).toBe(true);
      expect(got.columns.tie_strength.values).toEqual(rows.map((r) => r.tie));
      // The empty quoted cell is the missing marker "" (the quotes do not make it a value).
      expect(got.columns.crop.values).toEqual(rows.map((r) => (r.crop === "" ? null : r.crop)));
      expect(got.columns.open.values).toEqual(rows.map((r) => r.open));
    });
  }

  it("reads any quoted text back as written, whatever the chunk size (fast-check)", async () => {
    // Oracle: the generated cell texts themselves. Quoted fields at the very end of the
    // file (no final line break) check that the kernel never reads past the bytes of the
    // current chunk, where an earlier, longer chunk left its bytes behind.
    const textSchema = resolveDatasetSchema({
      name: "csv-text",
      columns: [
        { name: "a", role: "categorical" },
        { name: "b", role: "categorical" },
        { name: "open", role: "outcome" },
      ],
    });
    const cell = fc.stringMatching(/^[a-z",\r\n é]{0,6}$/);
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.tuple(cell, cell), { minLength: 1, maxLength: 12 }),
        fc.boolean(),
        fc.boolean(),
        fc.integer({ min: 1, max: 19 }),
        async (rows, crlf, finalBreak, chunkBytes) => {
          const eol = crlf ? "\r\n" : "\n";
          const q = (t: string): string => `"${t.replaceAll('"', '""')}"`;
          const body = rows.map(([a, b]) => `${q(a)},1,${q(b)}`).join(eol);
          const path = csvFile(`a,open,b${eol}${body}${finalBreak ? eol : ""}`);
          const got = await readAll(path, textSchema, { chunkBytes, batchRows: 5 });
          const value = (t: string): string | null => (t === "" ? null : t);
          expect(got.columns.a.values).toEqual(rows.map(([a]) => value(a)));
          expect(got.columns.b.values).toEqual(rows.map(([, b]) => value(b)));
        },
      ),
      { numRuns: 150 },
    );
  });

  it("codes categories alike whether or not they come from the byte cache", async () => {
    // 5000 distinct values, each seen three times, unquoted and quoted, plus the missing
    // marker "NA" and non-ASCII text: first sightings take the text path, later ones the cache.
    const values = Array.from({ length: 5000 }, (_, i) => (i % 100 === 0 ? "NA" : `crop-${i}-ä`));
    const order = [...values, ...values.map((v) => `"${v}"`), ...values.slice().reverse()];
    const path = csvFile("tie_strength,crop,open\n" + order.map((v) => `1,${v},1`).join("\n"));
    const dictionaries = new Map<string, CategoryDictionary>();
    const got = await readAll(path, schema, { batchRows: 1000, dictionaries });
    expect(dictionaries.get("crop")?.size).toBe(4950);
    const plain = (v: string): string | null =>
      v.replaceAll('"', "") === "NA" ? null : v.replaceAll('"', "");
    expect(got.columns.crop.values).toEqual(order.map(plain));
  });

  it("parses numbers exactly as Number() does (fast-check against the built-in parser)", async () => {
    const doubles = fc.double({ noNaN: true, noDefaultInfinity: true });
    const texts = fc.oneof(
      doubles.map((v) => String(v)),
      doubles.map((v) => v.toFixed(6)),
      fc.integer().map((v) => String(v)),
      fc.tuple(fc.nat(99999), fc.nat(9999)).map(([a, b]) => `${a}.${String(b).padStart(4, "0")}`),
    );
    await fc.assert(
      fc.asyncProperty(fc.array(texts, { minLength: 1, maxLength: 40 }), async (values) => {
        const path = csvFile("tie_strength,crop,open\n" + values.map((v) => `${v},a,1`).join("\n"));
        const got = await readAll(path, schema);
        expect(got.columns.tie_strength.values).toEqual(values.map((v) => Number(v)));
      }),
      { numRuns: 60 },
    );
  });
});
