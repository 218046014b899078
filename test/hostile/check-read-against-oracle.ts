import { readFileSync, rmSync } from "node:fs";
import { join } from "node:path";
import { openDataFile } from "../../trainer/data/open-data-file.js";
import type { ReadOptions, ReadStats } from "../../trainer/data/read-types.js";
import { LeafcastError } from "../../trainer/errors.js";
import { fuzzSchema, type CellValue } from "./fuzz-schema.js";
import type { OracleRead } from "./oracle-types.js";

/** Codes a bad row may carry (any reader, any role). */
const rowCodes = new Set([
  "ragged_row",
  "bad_quote",
  "not_a_number",
  "not_finite",
  "missing_value",
  "not_a_label",
  "negative_weight",
  "out_of_range",
  "invalid_utf8",
  "wrong_type",
  "bad_time",
  "invalid_json",
  "not_an_object",
]);

/** Codes that refuse a whole file. */
const fileCodes = new Set([
  "empty_file",
  "bad_header",
  "duplicate_column",
  "missing_column",
  "record_too_long",
]);

/** A read that takes longer than this is taken for a hang (generous: the machine is shared). */
const HANG_MS = 20_000;

interface ReadResult {
  columns: Map<string, CellValue[]>;
  stats: ReadStats;
}

/**
 * Reads `path` with both bad-row policies and throws (an assertion failure with
 * the case in its message) unless each outcome is what the oracle says: under
 * "fail", the first bad row's LeafcastError (file and row named), a file-level
 * LeafcastError, or exactly the oracle's rows; under "skip", the oracle's good
 * rows with every value equal (Object.is: NaN only where the oracle says
 * missing, -0 kept), the bad rows counted and listed by number in the rejects
 * file, and accepted + rejected = the oracle's data rows. Any other exception
 * type fails the check.
 */
export async function checkReadAgainstOracle(
  path: string,
  expected: OracleRead,
  options: ReadOptions,
  workDir: string,
): Promise<void> {
  const firstBad = expected.rows.find((r) => r.values === null);
  const fail = await readWithin(path, { ...options, badRows: "fail" });
  if (firstBad !== undefined) {
    expectRowError(fail, path, firstBad.row);
  } else if (expected.fileError) {
    expectFileError(fail);
  } else {
    expectRows(fail, expected);
  }

  const rejectsPath = join(workDir, "rejects.ndjson");
  rmSync(rejectsPath, { force: true });
  const skip = await readWithin(path, { ...options, badRows: "skip", rejectsPath });
  if (expected.fileError) {
    expectFileError(skip);
    return;
  }
  const got = expectRows(skip, expected);
  const badRows = expected.rows.filter((r) => r.values === null).map((r) => r.row);
  check(got.stats.rowsRejected === badRows.length, "rowsRejected", got.stats, badRows);
  check(
    got.stats.rowsAccepted + got.stats.rowsRejected === expected.rows.length,
    "accepted + rejected = data rows",
    got.stats,
    expected.rows.length,
  );
  const rejected = readFileSync(rejectsPath, "utf8")
    .split("\n")
    .filter((line) => line !== "")
    .map((line) => JSON.parse(line) as { row: number; code: string; file: string });
  check(
    sameList(
      rejected.map((r) => r.row),
      badRows,
    ),
    "rejected row numbers",
    rejected.map((r) => r.row),
    badRows,
  );
  for (const r of rejected) check(rowCodes.has(r.code), "reject code", r);
}

async function readWithin(path: string, options: ReadOptions): Promise<ReadResult | LeafcastError> {
  let timer: NodeJS.Timeout | undefined;
  const hang = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new Error(`read of ${path} took over ${HANG_MS} ms`)), HANG_MS);
  });
  try {
    return await Promise.race([read(path, options), hang]);
  } catch (error) {
    if (error instanceof LeafcastError) return error;
    throw error;
  } finally {
    clearTimeout(timer);
  }
}

async function read(path: string, options: ReadOptions): Promise<ReadResult> {
  const reader = openDataFile(path, fuzzSchema, options);
  const columns = new Map<string, CellValue[]>();
  for await (const batch of reader.batches()) {
    for (const [name, column] of batch.columns) {
      let out = columns.get(name);
      if (out === undefined) columns.set(name, (out = []));
      if (column.kind === "category") {
        for (let i = 0; i < batch.rowCount; i++) {
          const code = column.codes[i];
          out.push(code < 0 ? null : column.dictionary.valueOf(code));
        }
      } else {
        for (let i = 0; i < batch.rowCount; i++) out.push(column.values[i]);
      }
    }
  }
  return { columns, stats: reader.stats };
}

function expectRowError(got: ReadResult | LeafcastError, path: string, row: number): void {
  check(got instanceof LeafcastError, "expected a LeafcastError for a bad row", row);
  const error = got as LeafcastError;
  const issue = error.issues[0];
  check(
    error.issues.length === 1 &&
      issue.file === path &&
      issue.row === row &&
      rowCodes.has(issue.code),
    "the bad row's issue",
    error.issues,
    row,
  );
  if (issue.column !== undefined) {
    check(
      error.message.includes(`column "${issue.column}"`),
      "message names the column",
      error.message,
    );
  }
  check(error.message.includes(`row ${row})`), "message names the row", error.message);
}

function expectFileError(got: ReadResult | LeafcastError): void {
  check(got instanceof LeafcastError, "expected a file-level LeafcastError", got);
  const error = got as LeafcastError;
  check(
    error.issues.length > 0 && error.issues.every((i) => fileCodes.has(i.code)),
    "file-level codes",
    error.issues,
  );
}

function expectRows(got: ReadResult | LeafcastError, expected: OracleRead): ReadResult {
  if (got instanceof LeafcastError) {
    throw new Error(`expected rows, found LeafcastError: ${got.message}`);
  }
  const good = expected.rows.filter((r) => r.values !== null);
  check(got.stats.rowsAccepted === good.length, "rowsAccepted", got.stats, good.length);
  if (good.length === 0) return got;
  check(
    sameList([...got.columns.keys()], expected.columns),
    "columns",
    [...got.columns.keys()],
    expected.columns,
  );
  expected.columns.forEach((name, c) => {
    const values = got.columns.get(name) ?? [];
    const want = good.map((r) => (r.values as CellValue[])[c]);
    check(sameList(values, want), `values of column "${name}"`, values, want);
  });
  return got;
}

function sameList(a: readonly unknown[], b: readonly unknown[]): boolean {
  return a.length === b.length && a.every((v, i) => Object.is(v, b[i]));
}

function check(condition: boolean, what: string, ...found: unknown[]): void {
  if (condition) return;
  const shown = found.map((f) =>
    JSON.stringify(f, (_k, v: unknown) =>
      typeof v === "number" && !Number.isFinite(v) ? String(v) : Object.is(v, -0) ? "-0" : v,
    ),
  );
  throw new Error(`${what}: ${shown.join(" / ")}`);
}
