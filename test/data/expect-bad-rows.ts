import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, expect } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import { openDataFile } from "../../trainer/data/open-data-file.js";
import type { ReadOptions } from "../../trainer/data/read-types.js";
import type { ResolvedSchema } from "../../trainer/schema/load-dataset-schema.js";
import { collectBatches, type DecodedColumns } from "./collect-batches.js";

/** A bad row a test expects: where it is and the issue code. */
export interface BadRow {
  row: number;
  column: string | null;
  code: string;
}

/** Directories made for the test file that imported this module (vitest loads it afresh per file). */
const made: string[] = [];

// Tests call tempDir() freely, once per case: every directory goes when the file's tests end.
afterAll(() => {
  for (const dir of made.splice(0)) rmSync(dir, { recursive: true, force: true });
});

/** A fresh temporary directory for one test's files, removed after the calling test file's last test. */
export function tempDir(): string {
  const dir = mkdtempSync(join(tmpdir(), "leafcast-readers-"));
  made.push(dir);
  return dir;
}

/** Reads a whole file, returning the decoded columns or the error thrown. */
export async function readAll(
  path: string,
  schema: ResolvedSchema,
  options: ReadOptions = {},
): Promise<DecodedColumns> {
  return collectBatches(openDataFile(path, schema, options).batches());
}

/**
 * Checks both bad-row policies on a file: under "fail" the read throws for the
 * first bad row with a message naming file, row and column; under "skip" every
 * other row arrives, the stats count the bad rows by code, and the rejects file
 * holds exactly the bad rows. Returns the rows that arrived under "skip".
 */
export async function expectBadRows(
  path: string,
  schema: ResolvedSchema,
  bad: BadRow[],
  goodRows: number,
  options: ReadOptions = {},
): Promise<DecodedColumns> {
  const error = await readAll(path, schema, { ...options, badRows: "fail" }).then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(LeafcastError);
  const thrown = error as LeafcastError;
  const first = bad[0];
  expect(thrown.code).toBe(first.code);
  expect(thrown.issues).toHaveLength(1);
  expect(thrown.issues[0]).toMatchObject({ file: path, row: first.row, code: first.code });
  expect(thrown.issues[0].column ?? null).toBe(first.column);
  expect(thrown.message).toContain(`(${path} row ${first.row})`);
  if (first.column !== null) expect(thrown.message).toContain(`column "${first.column}"`);

  const rejectsPath = join(tempDir(), "rejects.ndjson");
  const reader = openDataFile(path, schema, { ...options, badRows: "skip", rejectsPath });
  const got = await collectBatches(reader.batches());
  const byCode: Record<string, number> = {};
  for (const b of bad) byCode[b.code] = (byCode[b.code] ?? 0) + 1;
  expect(reader.stats).toEqual({
    file: path,
    rowsAccepted: goodRows,
    rowsRejected: bad.length,
    rejectsPath,
    rejectedByCode: byCode,
  });
  expect(got.rowCount).toBe(goodRows);
  const lines = readFileSync(rejectsPath, "utf8")
    .split("\n")
    .filter((line) => line !== "")
    .map((line) => JSON.parse(line) as Record<string, unknown>);
  expect(lines.map((l) => ({ row: l.row, column: l.column, code: l.code }))).toEqual(bad);
  for (const line of lines) {
    expect(line.file).toBe(path);
    expect(typeof line.reason).toBe("string");
    expect(typeof line.raw).toBe("string");
  }
  return got;
}
