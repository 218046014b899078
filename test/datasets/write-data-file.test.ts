import { mkdtemp, readFile, readdir, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { tableFromIPC } from "apache-arrow";
import { parquetMetadata, parquetReadObjects } from "hyparquet";
import { createRequire } from "node:module";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import {
  DATA_FORMATS,
  type WrittenBatch,
  type WrittenColumn,
} from "../../trainer/data/write-columns.js";
import { writeDataFile } from "../../trainer/data/write-data-file.js";

// Every writer is read back here with an independent reader: Node's JSON.parse
// for NDJSON, a plain RFC 4180 split for CSV, hyparquet for Parquet and
// apache-arrow for Arrow IPC.

const columns: WrittenColumn[] = [
  { name: "tie_strength", type: "float64", decimals: 3 },
  { name: "raw", type: "float64" },
  { name: "photo_count", type: "int" },
  { name: "open", type: "label" },
  { name: "post_type", type: "category", categories: ["tip", 'say "hi", now', "grüße", "a\nb"] },
];
const batches: WrittenBatch[] = [
  {
    rowCount: 3,
    columns: {
      tie_strength: Float64Array.of(0.125, NaN, -2.5),
      raw: Float64Array.of(0.1 + 0.2, 1e21, -5e-324),
      photo_count: Int32Array.of(0, -7, 2147483647),
      open: Uint8Array.of(1, 0, 1),
      post_type: Int32Array.of(0, 1, -1),
    },
  },
  {
    // Arrays longer than rowCount: only the first rowCount values count.
    rowCount: 2,
    columns: {
      tie_strength: Float64Array.of(1, 0.001, 99),
      raw: Float64Array.of(Math.PI, NaN, 99),
      photo_count: Int32Array.of(3, 4, 99),
      open: Uint8Array.of(0, 0, 1),
      post_type: Int32Array.of(2, 3, 0),
    },
  },
];
const expected = {
  tie_strength: [0.125, NaN, -2.5, 1, 0.001],
  raw: [0.1 + 0.2, 1e21, -5e-324, Math.PI, NaN],
  photo_count: [0, -7, 2147483647, 3, 4],
  open: [1, 0, 1, 0, 0],
  post_type: ["tip", 'say "hi", now', null, "grüße", "a\nb"],
};

let dir = "";
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), "leafcast-write-"));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

/** Reads a file back with an independent reader into plain columns (null for missing). */
async function readBack(path: string, format: string): Promise<Record<string, unknown[]>> {
  const bytes = await readFile(path);
  let rows: Record<string, unknown>[];
  if (format === "ndjson") {
    rows = bytes
      .toString("utf8")
      .trimEnd()
      .split("\n")
      .map((line) => JSON.parse(line));
  } else if (format === "csv") {
    const [header, ...records] = parseCsv(bytes.toString("utf8"));
    rows = records.map((r) =>
      Object.fromEntries(header.map((name, c) => [name, r[c] === "" ? null : r[c]])),
    );
    for (const row of rows) {
      for (const name of ["tie_strength", "raw", "photo_count", "open"]) {
        row[name] = row[name] === null ? null : Number(row[name]);
      }
    }
  } else if (format === "parquet") {
    const buffer = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength);
    rows = await parquetReadObjects({ file: buffer });
  } else {
    const table = tableFromIPC(bytes);
    rows = table.toArray().map((row) => row.toJSON());
  }
  return Object.fromEntries(columns.map((c) => [c.name, rows.map((row) => row[c.name] ?? null)]));
}

/** A small RFC 4180 parser (quoted fields, doubled quotes, line breaks inside quotes). */
function parseCsv(text: string): string[][] {
  const records: string[][] = [];
  let record: string[] = [];
  let field = "";
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (quoted) {
      if (ch === '"' && text[i + 1] === '"') {
        field += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else field += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ",") {
      record.push(field);
      field = "";
    } else if (ch === "\n") {
      record.push(field);
      records.push(record);
      record = [];
      field = "";
    } else field += ch;
  }
  return records;
}

describe("writeDataFile", () => {
  for (const format of DATA_FORMATS) {
    it(`writes ${format} that an independent reader reads back exactly`, async () => {
      const path = join(dir, `small.${format}`);
      const summary = await writeDataFile(path, format, columns, batches);
      expect(summary.rows).toBe(5);
      expect(summary.bytes).toBe((await readFile(path)).byteLength);
      const back = await readBack(path, format);
      for (const name of ["tie_strength", "raw"] as const) {
        // Exact equality of doubles (NaN written as missing reads back as null).
        expect(back[name].map((v) => (v === null ? NaN : Number(v)))).toEqual(expected[name]);
      }
      expect(back.photo_count.map(Number)).toEqual(expected.photo_count);
      expect(back.open.map(Number)).toEqual(expected.open);
      expect(back.post_type).toEqual(expected.post_type);
      // No temporary file is left beside the result.
      expect((await readdir(dir)).filter((f) => f.endsWith(".tmp"))).toEqual([]);
    });
  }

  it("writes Parquet that parquet-wasm (the Rust implementation, a second independent reader) reads", async () => {
    const path = join(dir, "rust.parquet");
    await writeDataFile(path, "parquet", columns, batches);
    const wasm = createRequire(import.meta.url)("parquet-wasm/node") as {
      readParquet(bytes: Uint8Array): { intoIPCStream(): Uint8Array };
    };
    const table = tableFromIPC(
      wasm.readParquet(new Uint8Array(await readFile(path))).intoIPCStream(),
    );
    const rows = table.toArray().map((row) => row.toJSON());
    expect(rows.map((r) => r.tie_strength ?? NaN)).toEqual(expected.tie_strength);
    expect(rows.map((r) => r.raw ?? NaN)).toEqual(expected.raw);
    expect(rows.map((r) => r.post_type)).toEqual(expected.post_type);
    expect(rows.map((r) => r.photo_count)).toEqual(expected.photo_count);
  });

  it("writes one Parquet row group and one Arrow record batch per batch", async () => {
    const parquet = join(dir, "groups.parquet");
    const arrow = join(dir, "groups.arrow");
    await writeDataFile(parquet, "parquet", columns, batches);
    await writeDataFile(arrow, "arrow", columns, batches);
    const bytes = await readFile(parquet);
    const metadata = parquetMetadata(
      bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength),
    );
    expect(metadata.row_groups.map((g) => Number(g.num_rows))).toEqual([3, 2]);
    expect(tableFromIPC(await readFile(arrow)).batches.map((b) => b.numRows)).toEqual([3, 2]);
  });

  it("writes valid empty files with a header or schema only", async () => {
    for (const format of DATA_FORMATS) {
      const path = join(dir, `empty.${format}`);
      const summary = await writeDataFile(path, format, columns, []);
      expect(summary.rows).toBe(0);
    }
    expect(await readFile(join(dir, "empty.csv"), "utf8")).toBe(
      "tie_strength,raw,photo_count,open,post_type\n",
    );
    expect(await readFile(join(dir, "empty.ndjson"), "utf8")).toBe("");
    expect(
      tableFromIPC(await readFile(join(dir, "empty.arrow"))).schema.fields.map((f) => f.name),
    ).toEqual(columns.map((c) => c.name));
  });

  it("refuses a bad batch with coded issues and leaves no file behind", async () => {
    for (const format of DATA_FORMATS) {
      const path = join(dir, `bad.${format}`);
      const bad: WrittenBatch = {
        rowCount: 2,
        columns: {
          ...batches[0].columns,
          open: Uint8Array.of(0, 2),
          post_type: Int32Array.of(0, 9),
          raw: Float64Array.of(1),
        },
      };
      const error = await writeDataFile(path, format, columns, [batches[0], bad]).catch(
        (e: unknown) => e,
      );
      expect(error).toBeInstanceOf(LeafcastError);
      expect((error as LeafcastError).issues.map((i) => i.code)).toEqual([
        "short_column",
        "bad_label",
        "bad_code",
      ]);
      expect((error as LeafcastError).message).toContain(
        'write: column "open" expected 0 or 1, found 2 at batch row 2',
      );
    }
    expect((await readdir(dir)).filter((f) => f.startsWith("bad") || f.endsWith(".tmp"))).toEqual(
      [],
    );
  });

  it("refuses bad declarations", async () => {
    const error = await writeDataFile(
      join(dir, "x.csv"),
      "csv",
      [
        { name: "a", type: "float64", decimals: 16 },
        { name: "a", type: "label" },
        { name: "c", type: "category", categories: ["x", ""] },
      ],
      [],
    ).catch((e: unknown) => e);
    expect((error as LeafcastError).issues.map((i) => i.code)).toEqual([
      "bad_decimals",
      "duplicate_column",
      "bad_category",
    ]);
  });
});
