// Records of a million columns, records with no end, and values nested 100,000
// deep: the text readers either read them correctly or refuse them with a
// LeafcastError, within bounded memory (a record may not outgrow maxRecordBytes).
import { rmSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { openDataFile } from "../../trainer/data/open-data-file.js";
import type { ReadOptions } from "../../trainer/data/read-types.js";
import { LeafcastError } from "../../trainer/errors.js";
import { fuzzSchema, type CellValue } from "./fuzz-schema.js";
import { scratchDir } from "./scratch-dir.js";

const dir = scratchDir("leafcast-hostile-wide-");
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const MILLION = 1_000_000;

interface Outcome {
  columns: Map<string, CellValue[]>;
  rowsRejected: number;
  rejectedByCode: Readonly<Record<string, number>>;
  /** The largest growth of resident memory seen between batches, in bytes. */
  rssGrowth: number;
}

async function read(path: string, options: ReadOptions = {}): Promise<Outcome> {
  const rssBefore = process.memoryUsage.rss();
  let rssGrowth = 0;
  const reader = openDataFile(path, fuzzSchema, options);
  const columns = new Map<string, CellValue[]>();
  for await (const batch of reader.batches()) {
    rssGrowth = Math.max(rssGrowth, process.memoryUsage.rss() - rssBefore);
    for (const [name, column] of batch.columns) {
      const out = columns.get(name) ?? [];
      columns.set(name, out);
      for (let i = 0; i < batch.rowCount; i++) {
        if (column.kind !== "category") out.push(column.values[i]);
        else out.push(column.codes[i] < 0 ? null : column.dictionary.valueOf(column.codes[i]));
      }
    }
  }
  const { rowsRejected, rejectedByCode } = reader.stats;
  return { columns, rowsRejected, rejectedByCode, rssGrowth };
}

async function refusal(path: string, options: ReadOptions = {}): Promise<LeafcastError> {
  const error = await read(path, options).then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(LeafcastError);
  return error as LeafcastError;
}

function file(name: string, text: string): string {
  const path = join(dir, name);
  writeFileSync(path, text);
  return path;
}

describe("records of a million columns", () => {
  it("reads a CSV whose header has 1,000,000 columns, the schema's among them", async () => {
    const names = Array.from({ length: MILLION }, (_, i) => `c${i}`);
    names[0] = "crop";
    names[MILLION / 2] = "x";
    names[MILLION - 1] = "open";
    const row = (x: string, crop: string, open: string): string =>
      names.map((n) => (n === "x" ? x : n === "crop" ? crop : n === "open" ? open : "9")).join(",");
    const path = file(
      "wide-header.csv",
      [names.join(","), row("1.5", "kale", "1"), row("-0", "leek", "0")].join("\n"),
    );
    const got = await read(path);
    expect(got.columns.get("x")).toEqual([1.5, -0]);
    expect(got.columns.get("crop")).toEqual(["kale", "leek"]);
    expect(got.columns.get("open")).toEqual([1, 0]);
    // About 7 MB of header and two 2 MB rows: far below a gigabyte of growth.
    expect(got.rssGrowth).toBeLessThan(1 << 30);
  });

  it("rejects a CSV row of 1,000,000 fields as ragged and reads the rows around it", async () => {
    const path = file(
      "wide-row.csv",
      `x,crop,open\n1,kale,1\n2,leek,0${",7".repeat(MILLION - 3)}\n3,okra,0\n`,
    );
    const error = await refusal(path);
    expect(error.issues[0]).toMatchObject({ code: "ragged_row", row: 2, file: path });
    const got = await read(path, { badRows: "skip" });
    expect(got.columns.get("x")).toEqual([1, 3]);
    expect(got.rejectedByCode).toEqual({ ragged_row: 1 });
  });

  it("refuses a header naming one schema column 1,000,000 times, saying so once", async () => {
    const path = file("same-name.csv", `x,crop,${Array(MILLION).fill("open").join(",")}\n1,a,1\n`);
    const error = await refusal(path);
    expect(error.issues).toEqual([
      {
        code: "duplicate_column",
        message: `column "open" expected once, found ${MILLION} times`,
        file: path,
        column: "open",
      },
    ]);
  });

  it("reads an NDJSON object with 1,000,000 keys", async () => {
    const keys = Array.from({ length: MILLION }, (_, i) => `"k${i}":${i % 10}`).join(",");
    const path = file(
      "wide.ndjson",
      `{${keys},"x":2.5,"crop":"kale","open":true}\n{"x":-1,"crop":"leek","open":0}\n`,
    );
    const got = await read(path);
    expect(got.columns.get("x")).toEqual([2.5, -1]);
    expect(got.columns.get("crop")).toEqual(["kale", "leek"]);
    expect(got.columns.get("open")).toEqual([1, 0]);
  });
});

describe("records longer than maxRecordBytes", () => {
  const limit = 1 << 20;

  it("refuses a CSV row with no end, naming its row, whatever the chunk size", async () => {
    const path = file("endless.csv", `x,crop,open\n1,kale,1\n2,${"k".repeat(3 * limit)}`);
    for (const chunkBytes of [4096, 1 << 16, 1 << 20]) {
      for (const badRows of ["fail", "skip"] as const) {
        const error = await refusal(path, { maxRecordBytes: limit, chunkBytes, badRows });
        expect(error.issues).toEqual([
          {
            code: "record_too_long",
            message: `expected a record of at most ${limit} bytes, found a longer one`,
            file: path,
            row: 2,
          },
        ]);
      }
    }
  });

  it("refuses a CSV header with no end, and a quoted field left open for megabytes", async () => {
    const header = file("endless-header.csv", `x,crop,${"o".repeat(2 * limit)}`);
    expect((await refusal(header, { maxRecordBytes: limit })).issues[0]).toMatchObject({
      code: "record_too_long",
      message: `expected a header of at most ${limit} bytes, found a longer one`,
    });
    const quoted = file("open-quote.csv", `x,crop,open\n1,"${"kale\n".repeat(limit)}`);
    expect((await refusal(quoted, { maxRecordBytes: limit })).issues[0]).toMatchObject({
      code: "record_too_long",
      row: 1,
    });
  });

  it("refuses an NDJSON line with no end, naming its line", async () => {
    const path = file(
      "endless.ndjson",
      `{"x":1,"crop":"a","open":1}\n\n{"crop":"${"k".repeat(3 * limit)}`,
    );
    const error = await refusal(path, { maxRecordBytes: limit, badRows: "skip" });
    expect(error.issues[0]).toMatchObject({ code: "record_too_long", row: 3, file: path });
  });

  it("reads a record of exactly maxRecordBytes", async () => {
    const crop = "k".repeat(limit - "1,,1\n".length);
    const path = file("just-fits.csv", `x,crop,open\n1,${crop},1\n2,a,0\n`);
    const got = await read(path, { maxRecordBytes: limit, chunkBytes: 4096 });
    expect(got.columns.get("x")).toEqual([1, 2]);
    expect(got.columns.get("crop")?.[0]).toHaveLength(crop.length);
  });

  it("checks the option itself", async () => {
    for (const maxRecordBytes of [0, -1, 1.5, Number.NaN, 2 ** 60]) {
      expect(() => openDataFile("a.csv", fuzzSchema, { maxRecordBytes })).toThrow(LeafcastError);
    }
  });
});

describe("values nested 100,000 deep", () => {
  it("rejects an NDJSON cell of 100,000 nested arrays or objects as a bad row", async () => {
    const depth = 100_000;
    const arrays = "[".repeat(depth) + "]".repeat(depth);
    const objects = '{"a":'.repeat(depth) + "1" + "}".repeat(depth);
    const path = file(
      "deep.ndjson",
      [
        `{"x":1,"crop":"kale","open":1}`,
        `{"x":${arrays},"crop":"kale","open":1}`,
        `{"x":2,"crop":${objects},"open":1}`,
        `{"x":3,"crop":"leek","open":0,"note":${arrays}}`,
        arrays,
      ].join("\n"),
    );
    const got = await read(path, { badRows: "skip" });
    expect(got.columns.get("x")).toEqual([1, 3]);
    expect(got.rejectedByCode).toEqual({ wrong_type: 2, not_an_object: 1 });
  });
});
