import { readdirSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { CategoryDictionary } from "../../trainer/data/category-dictionary.js";
import { openDataFile } from "../../trainer/data/open-data-file.js";
import { LeafcastError } from "../../trainer/errors.js";
import { resolveDatasetSchema } from "../../trainer/schema/load-dataset-schema.js";
import { collectBatches } from "./collect-batches.js";
import { readAll, tempDir } from "./expect-bad-rows.js";

const schema = resolveDatasetSchema({
  name: "open-test",
  columns: [
    { name: "tie_strength", role: "numeric" },
    { name: "crop", role: "categorical" },
    { name: "open", role: "outcome" },
  ],
});

function file(name: string, text: string, dir = tempDir()): string {
  const path = join(dir, name);
  writeFileSync(path, text);
  return path;
}

describe("openDataFile", () => {
  it("takes the format from the extension, case-insensitively", () => {
    const cases: [string, string][] = [
      ["a.CSV", "csv"],
      ["a.ndjson", "ndjson"],
      ["a.JsonL", "ndjson"],
      ["a.parquet", "parquet"],
      ["a.arrow", "arrow"],
      ["a.arrows", "arrow"],
      ["a.feather", "arrow"],
      ["a.IPC", "arrow"],
    ];
    for (const [name, format] of cases) expect(openDataFile(name, schema).format).toBe(format);
    expect(openDataFile("data.txt", schema, { format: "csv" }).format).toBe("csv");
  });

  it("refuses an unknown extension and bad options", () => {
    expect(() => openDataFile("dir.v2/data", schema)).toThrow(
      /data: expected a file name ending in .csv.* found no extension \(dir\.v2\/data\)/,
    );
    expect(() => openDataFile("a.xlsx", schema)).toThrow(/found "\.xlsx"/);
    const error = (() => {
      try {
        openDataFile("a.csv", schema, { batchRows: 0, rejectsPath: "r.ndjson" });
      } catch (e) {
        return e as LeafcastError;
      }
      return null;
    })();
    expect(error?.issues.map((i) => i.code)).toEqual(["bad_option", "bad_option"]);
    expect(error?.message).toContain('rejectsPath expected badRows "skip", found badRows "fail"');
  });

  it("turns a missing file into a LeafcastError naming it", async () => {
    const path = join(tempDir(), "nowhere.csv");
    const error = await readAll(path, schema).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(LeafcastError);
    expect((error as LeafcastError).issues[0]).toMatchObject({ code: "unreadable", file: path });
  });

  it("shares categorical codes across files through one dictionary map", async () => {
    const dictionaries = new Map<string, CategoryDictionary>();
    const a = file("a.csv", "tie_strength,crop,open\n1,kale,1\n2,leek,0\n");
    const b = file(
      "b.ndjson",
      '{"tie_strength":1,"crop":"leek","open":1}\n{"tie_strength":1,"crop":"okra","open":1}\n',
    );
    const codes: number[] = [];
    for (const path of [a, b]) {
      for await (const batch of openDataFile(path, schema, { dictionaries }).batches()) {
        const crop = batch.columns.get("crop");
        if (crop?.kind !== "category") throw new Error("expected categories");
        expect(crop.dictionary).toBe(dictionaries.get("crop"));
        codes.push(...crop.codes);
      }
    }
    expect(codes).toEqual([0, 1, 1, 2]);
    expect(dictionaries.get("crop")?.list()).toEqual(["kale", "leek", "okra"]);
  });

  it("does not put values of rejected rows into the dictionary", async () => {
    const path = file("a.csv", "tie_strength,crop,open\n1,kale,1\nx,ghost,0\n");
    const dictionaries = new Map<string, CategoryDictionary>();
    await readAll(path, schema, { badRows: "skip", dictionaries });
    expect(dictionaries.get("crop")?.list()).toEqual(["kale"]);
  });

  it("writes the rejects file only when the read completes, and leaves no temporary file", async () => {
    const dir = tempDir();
    const rejectsPath = join(dir, "rejects.ndjson");
    const clean = file("clean.csv", "tie_strength,crop,open\n1,kale,1\n", dir);
    const reader = openDataFile(clean, schema, { badRows: "skip", rejectsPath });
    await collectBatches(reader.batches());
    expect(readFileSync(rejectsPath, "utf8")).toBe("");
    expect(reader.stats.rejectsPath).toBe(rejectsPath);

    // A read that fails (here on a file-level error) keeps the earlier rejects file as it was.
    writeFileSync(rejectsPath, "previous\n");
    const missing = file("missing.csv", "tie_strength,crop\n1,a\n", dir);
    await expect(readAll(missing, schema, { badRows: "skip", rejectsPath })).rejects.toThrow(
      /missing_column|required/,
    );
    expect(readFileSync(rejectsPath, "utf8")).toBe("previous\n");

    // An abandoned read (the consumer stops early) leaves the target alone too.
    const many = file("many.csv", "tie_strength,crop,open\n" + "x,a,1\n1,a,1\n".repeat(50), dir);
    const abandoned = openDataFile(many, schema, { badRows: "skip", rejectsPath, batchRows: 5 });
    for await (const batch of abandoned.batches()) {
      expect(batch.rowCount).toBe(5);
      break;
    }
    expect(readFileSync(rejectsPath, "utf8")).toBe("previous\n");
    expect(readdirSync(dir).filter((name) => name.endsWith(".tmp"))).toEqual([]);
    expect(abandoned.stats.rejectsPath).toBeNull();
  });

  it("keeps stats live and stops when the signal aborts", async () => {
    const path = file("big.csv", "tie_strength,crop,open\n" + "1,a,1\n".repeat(100));
    const controller = new AbortController();
    const reader = openDataFile(path, schema, { batchRows: 10, signal: controller.signal });
    let seen = 0;
    const run = async (): Promise<void> => {
      for await (const batch of reader.batches()) {
        seen += batch.rowCount;
        expect(reader.stats.rowsAccepted).toBe(seen);
        if (seen === 30) controller.abort(new Error("stop here"));
      }
    };
    await expect(run()).rejects.toThrow("stop here");
    expect(seen).toBe(30);
    expect(() => reader.batches()).toThrow(/only once/);
  });

  it("reads past columns of role ignore even when they are absent", async () => {
    const withIgnore = resolveDatasetSchema({
      name: "ignore-test",
      columns: [
        { name: "tie_strength", role: "numeric" },
        { name: "open", role: "outcome" },
        { name: "free_text", role: "ignore" },
      ],
    });
    const got = await readAll(file("a.csv", "open,tie_strength\n1,2\n"), withIgnore);
    expect(Object.keys(got.columns)).toEqual(["tie_strength", "open"]);
    const present = await readAll(
      file("b.csv", "open,free_text,tie_strength\n1,hello,2\n"),
      withIgnore,
    );
    expect(Object.keys(present.columns)).toEqual(["tie_strength", "open"]);
  });
});
