import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { openDataFile } from "../../trainer/data/open-data-file.js";
import { resolveDatasetSchema } from "../../trainer/schema/load-dataset-schema.js";
import { collectBatches } from "./collect-batches.js";

// Golden files: the same six rows in every format, made by
// test/fixtures/readers/make-fixtures.ts (Parquet by parquet-wasm, Arrow by
// apache-arrow's writers); the expected columns come from that script's row
// table, not from Leafcast.
const dir = join(import.meta.dirname, "../fixtures/readers");
const schema = resolveDatasetSchema(
  JSON.parse(readFileSync(join(dir, "golden.schema.json"), "utf8")),
);
const expected = JSON.parse(readFileSync(join(dir, "golden.expected.json"), "utf8")) as {
  rowCount: number;
  columns: Record<string, { kind: string; values: (number | string | null)[] }>;
};

const files = [
  ["golden.csv", "csv"],
  ["golden.ndjson", "ndjson"],
  ["golden-zstd.parquet", "parquet"],
  ["golden-snappy.parquet", "parquet"],
  ["golden-gzip.parquet", "parquet"],
  ["golden.arrow", "arrow"],
  ["golden.arrows", "arrow"],
] as const;

describe("golden files", () => {
  for (const [name, format] of files) {
    for (const batchRows of [1, 4, 65536]) {
      it(`${name} reads as expected with batchRows ${batchRows}`, async () => {
        // chunkBytes 7 cuts CSV and NDJSON records (and the BOM) across reads.
        const reader = openDataFile(join(dir, name), schema, { batchRows, chunkBytes: 7 });
        expect(reader.format).toBe(format);
        const got = await collectBatches(reader.batches());
        expect(got.rowCount).toBe(expected.rowCount);
        expect(Object.keys(got.columns)).toEqual(Object.keys(expected.columns));
        for (const [column, want] of Object.entries(expected.columns)) {
          const have = got.columns[column];
          expect(have.kind, column).toBe(want.kind);
          if (want.kind === "number") {
            // Float32 weights and float64 text round-trip exactly for these values; 1e-12 allows for neither being needed.
            have.values.forEach((v, i) => {
              const w = want.values[i];
              if (w === null) expect(v, `${column}[${i}]`).toBeNull();
              else expect(v as number, `${column}[${i}]`).toBeCloseTo(w as number, 12);
            });
          } else {
            expect(have.values, column).toEqual(want.values);
          }
        }
        const sizes = got.batchSizes;
        expect(sizes.slice(0, -1).every((size) => size === batchRows)).toBe(true);
        expect(sizes[sizes.length - 1]).toBeLessThanOrEqual(batchRows);
        expect(reader.stats).toMatchObject({ rowsAccepted: 6, rowsRejected: 0, rejectsPath: null });
      });
    }
  }
});
