import { mkdtemp, readFile, readdir, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { generatePlotline } from "../../datasets/plotline/generate-plotline.js";
import { plotlineColumns } from "../../datasets/plotline/plotline-columns.js";
import {
  resolvePlotlineOptions,
  type PlotlineOptions,
} from "../../datasets/plotline/plotline-options.js";
import { writePlotline } from "../../datasets/plotline/write-plotline.js";
import { openDataFile } from "../../trainer/data/open-data-file.js";
import { DATA_FORMATS } from "../../trainer/data/write-columns.js";
import {
  loadDatasetSchema,
  type ResolvedSchema,
} from "../../trainer/schema/load-dataset-schema.js";

// A smaller cast than the defaults keeps the test quick; the rows still span several chunks.
const OPTIONS: PlotlineOptions = {
  seed: 21,
  rows: 20_000,
  chunkRows: 8192,
  viewers: 5000,
  authors: 500,
};
let dir = "";
let schema: ResolvedSchema;

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), "leafcast-plotline-"));
  schema = await loadDatasetSchema("datasets/plotline.schema.json");
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

/** A read decoded to plain values: numbers (NaN kept), labels, category texts (null when missing). */
async function readColumns(path: string): Promise<Map<string, (number | string | null)[]>> {
  const out = new Map<string, (number | string | null)[]>();
  for await (const batch of openDataFile(path, schema, { batchRows: 5000 }).batches()) {
    for (const [name, column] of batch.columns) {
      const target = out.get(name) ?? [];
      out.set(name, target);
      if (column.kind === "category") {
        for (const code of column.codes)
          target.push(code < 0 ? null : column.dictionary.valueOf(code));
      } else {
        target.push(...column.values);
      }
    }
  }
  return out;
}

/** "" when equal; else where and how they differ. Object.is: NaN matches NaN, the doubles must be identical. */
function firstDifference(actual: unknown[], expected: unknown[]): string {
  if (actual.length !== expected.length)
    return `length ${actual.length}, expected ${expected.length}`;
  for (let i = 0; i < actual.length; i++) {
    if (!Object.is(actual[i], expected[i]))
      return `row ${i + 1}: ${String(actual[i])}, expected ${String(expected[i])}`;
  }
  return "";
}

describe("writePlotline", () => {
  it("writes byte-identical files for the same seed, in every format, and other files for another seed", async () => {
    for (const format of DATA_FORMATS) {
      const a = join(dir, `a.${format}`);
      const b = join(dir, `b.${format}`);
      const c = join(dir, `c.${format}`);
      const options = { ...OPTIONS, rows: 5000 };
      await writePlotline(a, format, options);
      await writePlotline(b, format, options);
      await writePlotline(c, format, { ...options, seed: 22 });
      const [bytesA, bytesB, bytesC] = await Promise.all([a, b, c].map((p) => readFile(p)));
      expect(bytesA.equals(bytesB), format).toBe(true);
      expect(bytesA.equals(bytesC), format).toBe(false);
    }
    expect((await readdir(dir)).filter((f) => f.endsWith(".tmp"))).toEqual([]);
  });

  it("reads back identical columns from CSV, NDJSON, Parquet and Arrow, equal to the generated ones", async () => {
    const reads = [];
    for (const format of DATA_FORMATS) {
      const path = join(dir, `plotline.${format}`);
      const summary = await writePlotline(path, format, OPTIONS);
      expect(summary.rows).toBe(20_000);
      reads.push(await readColumns(path));
    }
    // The reference: the generator's own arrays, with the timestamp in the
    // readers' milliseconds and categories as their texts.
    const columns = plotlineColumns(resolvePlotlineOptions(OPTIONS));
    const reference = new Map<string, (number | string | null)[]>(columns.map((c) => [c.name, []]));
    for (const chunk of generatePlotline(OPTIONS)) {
      for (const column of columns) {
        const values = chunk.columns[column.name as keyof typeof chunk.columns];
        const target = reference.get(column.name)!;
        for (let i = 0; i < chunk.rowCount; i++) {
          const v = values[i];
          if (column.type === "category") target.push(v < 0 ? null : column.categories[v]);
          else target.push(column.name === "timestamp" ? v * 1000 : v);
        }
      }
    }
    for (const [f, read] of reads.entries()) {
      expect([...read.keys()].sort(), DATA_FORMATS[f]).toEqual([...reference.keys()].sort());
      for (const [name, expected] of reference) {
        expect(firstDifference(read.get(name)!, expected), `${DATA_FORMATS[f]} ${name}`).toBe("");
      }
    }
  });
});
