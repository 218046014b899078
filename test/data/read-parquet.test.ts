import { readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { parquetMetadataAsync } from "hyparquet";
import { parquetWriteBuffer } from "hyparquet-writer";
import { describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import { resolveDatasetSchema } from "../../trainer/schema/load-dataset-schema.js";
import { expectBadRows, readAll, tempDir } from "./expect-bad-rows.js";

const fixtures = join(import.meta.dirname, "../fixtures/readers");
const goldenSchema = resolveDatasetSchema(
  JSON.parse(readFileSync(join(fixtures, "golden.schema.json"), "utf8")),
);

const schema = resolveDatasetSchema({
  name: "parquet-test",
  columns: [
    { name: "tie_strength", role: "numeric" },
    { name: "score", role: "numeric" },
    { name: "crop", role: "categorical" },
    { name: "open", role: "outcome" },
    { name: "shown_at", role: "timestamp", timeUnit: "s" },
  ],
});

function parquetFile(buffer: ArrayBuffer, name = "plots.parquet"): string {
  const path = join(tempDir(), name);
  writeFileSync(path, new Uint8Array(buffer));
  return path;
}

describe("readParquet", () => {
  it("golden fixtures use the codecs they are named for, in two row groups", async () => {
    // Checked with hyparquet's own metadata reader, so the golden test really covers each codec.
    for (const [name, codec] of [
      ["golden-zstd.parquet", "ZSTD"],
      ["golden-snappy.parquet", "SNAPPY"],
      ["golden-gzip.parquet", "GZIP"],
    ]) {
      const bytes = readFileSync(join(fixtures, name));
      const metadata = await parquetMetadataAsync(
        bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.length),
      );
      expect(metadata.row_groups).toHaveLength(2);
      expect(
        new Set(metadata.row_groups.flatMap((g) => g.columns.map((c) => c.meta_data?.codec))),
      ).toEqual(new Set([codec]));
    }
  });

  it("rejects text that is not a number, NaN and labels other than 0/1, row by row", async () => {
    const path = parquetFile(
      parquetWriteBuffer({
        columnData: [
          { name: "tie_strength", data: ["1.5", "n/a", "2", "2.5", "3", "4"], type: "STRING" },
          { name: "score", data: [1, 2, Number.NaN, 4, 5, 6], type: "DOUBLE" },
          { name: "crop", data: [7n, 8n, 7n, 9n, 7n, 8n], type: "INT64" },
          { name: "open", data: [1, 0, 1, 2, 0, 1], type: "INT32" },
          {
            name: "shown_at",
            data: [1, 2, 3, 4, 5, 6].map((s) => new Date(s * 1000)),
            type: "TIMESTAMP",
          },
          { name: "note", data: ["a", "b", "c", "d", "e", "f"], type: "STRING" },
        ],
        rowGroupSize: 4,
      }),
    );
    const got = await expectBadRows(
      path,
      schema,
      [
        { row: 2, column: "tie_strength", code: "not_a_number" },
        { row: 3, column: "score", code: "not_finite" },
        { row: 4, column: "open", code: "not_a_label" },
      ],
      3,
    );
    expect(got.columns.tie_strength.values).toEqual([1.5, 3, 4]);
    expect(got.columns.crop.values).toEqual(["7", "7", "8"]);
    // A Parquet timestamp is an instant whatever the schema's time unit: epoch milliseconds.
    expect(got.columns.shown_at.values).toEqual([1000, 5000, 6000]);
    const error = await readAll(path, schema).catch((e: unknown) => e);
    expect(String(error)).toBe(
      `LeafcastError: parquet: column "tie_strength" expected a number, found "n/a" (${path} row 2)`,
    );
  });

  it("rejects a value of the wrong type (a timestamp where a number is declared)", async () => {
    const path = parquetFile(
      parquetWriteBuffer({
        columnData: [
          { name: "tie_strength", data: [new Date(0), new Date(1)], type: "TIMESTAMP" },
          { name: "score", data: [1, 2], type: "DOUBLE" },
          { name: "crop", data: ["a", "b"], type: "STRING" },
          { name: "open", data: [true, false], type: "BOOLEAN" },
          { name: "shown_at", data: [1, 2], type: "DOUBLE" },
        ],
      }),
    );
    await expectBadRows(
      path,
      schema,
      [
        { row: 1, column: "tie_strength", code: "wrong_type" },
        { row: 2, column: "tie_strength", code: "wrong_type" },
      ],
      0,
    );
  });

  it("reads many row groups in batches that cut across them", async () => {
    const n = 5000;
    const tie = Float64Array.from({ length: n }, (_, i) => i / 3);
    const open = Int32Array.from({ length: n }, (_, i) => (i % 5 === 0 ? 1 : 0));
    const path = parquetFile(
      parquetWriteBuffer({
        columnData: [
          { name: "tie_strength", data: tie, type: "DOUBLE" },
          {
            name: "score",
            data: Array.from({ length: n }, (_, i) => (i % 9 === 0 ? null : i)),
            type: "DOUBLE",
          },
          { name: "crop", data: Array.from({ length: n }, (_, i) => `c${i % 11}`), type: "STRING" },
          { name: "open", data: open, type: "INT32" },
          {
            name: "shown_at",
            data: Float64Array.from({ length: n }, (_, i) => 1.7e9 + i),
            type: "DOUBLE",
          },
        ],
        rowGroupSize: 1000,
        codec: "UNCOMPRESSED",
      }),
    );
    const got = await readAll(path, schema, { batchRows: 768 });
    expect(got.batchSizes).toEqual([...Array<number>(6).fill(768), 5000 - 6 * 768]);
    expect(got.columns.tie_strength.values).toEqual(Array.from(tie));
    expect(got.columns.score.values).toEqual(
      Array.from({ length: n }, (_, i) => (i % 9 === 0 ? null : i)),
    );
    expect(got.columns.crop.values).toEqual(Array.from({ length: n }, (_, i) => `c${i % 11}`));
    expect(got.columns.open.values).toEqual(Array.from(open));
    // timeUnit "s": seconds become milliseconds.
    expect(got.columns.shown_at.values[1]).toBe((1.7e9 + 1) * 1000);
  });

  it("refuses a file without a required column", async () => {
    const path = parquetFile(
      parquetWriteBuffer({ columnData: [{ name: "score", data: [1], type: "DOUBLE" }] }),
    );
    const error = await readAll(path, schema, { badRows: "skip" }).catch((e: unknown) => e);
    expect((error as LeafcastError).issues.map((i) => [i.code, i.column])).toEqual([
      ["missing_column", "tie_strength"],
      ["missing_column", "crop"],
      ["missing_column", "open"],
      ["missing_column", "shown_at"],
    ]);
  });

  it("says a truncated or damaged file is truncated or damaged", async () => {
    const bytes = readFileSync(join(fixtures, "golden-zstd.parquet"));
    const damaged = Buffer.from(bytes);
    damaged.fill(0xab, 4, Math.floor(bytes.length / 2));
    for (const cut of [
      bytes.subarray(0, bytes.length - 1),
      bytes.subarray(0, bytes.length / 2),
      bytes.subarray(0, 10),
      damaged,
    ]) {
      const path = join(tempDir(), "cut.parquet");
      writeFileSync(path, cut);
      const error = await readAll(path, goldenSchema).catch((e: unknown) => e);
      expect(error).toBeInstanceOf(LeafcastError);
      expect((error as LeafcastError).code).toBe("damaged_file");
      expect(String(error)).toMatch(
        /^LeafcastError: parquet: file is truncated or damaged: .+ \(.+cut\.parquet\)$/,
      );
    }
  });

  it("says 'empty file' for an empty file", async () => {
    const path = join(tempDir(), "empty.parquet");
    writeFileSync(path, "");
    const error = await readAll(path, goldenSchema).catch((e: unknown) => e);
    expect(String(error)).toBe(
      `LeafcastError: parquet: expected a Parquet file, found an empty file (${path})`,
    );
  });
});
