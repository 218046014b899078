import { LeafcastError, type Issue } from "../errors.js";
import type { DataFormat } from "./detect-data-format.js";

export type { DataFormat } from "./detect-data-format.js";

/** Every format, in a fixed order (for loops in tests and benches). */
export const DATA_FORMATS: readonly DataFormat[] = ["csv", "ndjson", "parquet", "arrow"];

/**
 * How one column is declared to a writer. The batch holds its values as:
 * - "float64": a Float64Array; NaN is a missing value. `decimals` promises that
 *   every value is `Math.round(x * 10 ** decimals) / 10 ** decimals`, which
 *   lets text writers use a fast fixed-point formatter (values that break the
 *   promise are still written exactly, only slower).
 * - "int": an Int32Array of whole numbers, never missing.
 * - "label": a Uint8Array of 0/1 outcome labels.
 * - "category": an Int32Array of codes into `categories`; -1 is missing.
 */
export type WrittenColumn =
  | { readonly name: string; readonly type: "float64"; readonly decimals?: number }
  | { readonly name: string; readonly type: "int" }
  | { readonly name: string; readonly type: "label" }
  | { readonly name: string; readonly type: "category"; readonly categories: readonly string[] };

export type WrittenValues = Float64Array | Int32Array | Uint8Array;

/** A run of rows, column by column, keyed by the declared column names. */
export interface WrittenBatch {
  readonly rowCount: number;
  readonly columns: Readonly<Record<string, WrittenValues>>;
}

/** What a writer reports when the file is in place. */
export interface WriteSummary {
  readonly path: string;
  readonly rows: number;
  readonly bytes: number;
}

/**
 * Checks column declarations once per file: unique non-empty names, decimals in
 * 0..15, category texts unique and non-empty (an empty text would read back as
 * missing). Throws one LeafcastError with every problem.
 *
 * @example
 * checkWrittenColumns([{ name: "tie_strength", type: "float64", decimals: 3 }]);
 */
export function checkWrittenColumns(columns: readonly WrittenColumn[]): void {
  const issues: Issue[] = [];
  const seen = new Set<string>();
  if (columns.length === 0) {
    issues.push({ code: "no_columns", message: "expected at least one column, found none" });
  }
  for (const column of columns) {
    if (column.name.length === 0) {
      issues.push({ code: "empty_name", message: "expected a column name, found an empty one" });
    }
    if (seen.has(column.name)) {
      issues.push({
        code: "duplicate_column",
        message: `column "${column.name}" is declared twice`,
        column: column.name,
      });
    }
    seen.add(column.name);
    if (column.type === "float64" && column.decimals !== undefined) {
      const d = column.decimals;
      if (!Number.isInteger(d) || d < 0 || d > 15) {
        issues.push({
          code: "bad_decimals",
          message: `column "${column.name}" expected decimals from 0 to 15, found ${d}`,
          column: column.name,
        });
      }
    }
    if (column.type === "category") {
      const texts = new Set<string>();
      for (const text of column.categories) {
        if (text.length === 0 || texts.has(text)) {
          issues.push({
            code: "bad_category",
            message: `column "${column.name}" expected unique non-empty category texts, found ${JSON.stringify(text)} ${text.length === 0 ? "(empty)" : "twice"}`,
            column: column.name,
          });
        }
        texts.add(text);
      }
    }
  }
  if (issues.length > 0) throw new LeafcastError("write", issues);
}

/**
 * Checks one batch against the declarations: every column present with the
 * right array type and at least `rowCount` values, labels 0/1, category codes
 * in range. Writers call it before they touch a batch, so a bad batch leaves
 * no half-written file behind (the temporary file is removed).
 *
 * @example
 * checkWrittenBatch(columns, { rowCount: 2, columns: { open: Uint8Array.of(0, 1) } });
 */
export function checkWrittenBatch(columns: readonly WrittenColumn[], batch: WrittenBatch): void {
  const issues: Issue[] = [];
  const n = batch.rowCount;
  if (!Number.isInteger(n) || n < 0) {
    throw new LeafcastError("write", [
      { code: "bad_row_count", message: `expected a whole row count, found ${n}` },
    ]);
  }
  for (const column of columns) {
    const values = batch.columns[column.name];
    const expected = EXPECTED_ARRAY[column.type];
    if (values === undefined) {
      issues.push({
        code: "missing_column",
        message: `column "${column.name}" is declared but absent from the batch`,
        column: column.name,
      });
      continue;
    }
    if (!(values instanceof expected.type)) {
      issues.push({
        code: "wrong_array_type",
        message: `column "${column.name}" expected a ${expected.name}, found a ${values.constructor.name}`,
        column: column.name,
      });
      continue;
    }
    if (values.length < n) {
      issues.push({
        code: "short_column",
        message: `column "${column.name}" expected ${n} values, found ${values.length}`,
        column: column.name,
      });
      continue;
    }
    const bad =
      column.type === "label"
        ? firstBadLabel(values as Uint8Array, n)
        : column.type === "category"
          ? firstBadCode(values as Int32Array, n, column.categories.length)
          : -1;
    if (bad >= 0) {
      const expectation =
        column.type === "label" ? "0 or 1" : `a code from -1 to ${columnSize(column) - 1}`;
      issues.push({
        code: column.type === "label" ? "bad_label" : "bad_code",
        message: `column "${column.name}" expected ${expectation}, found ${values[bad]} at batch row ${bad + 1}`,
        column: column.name,
      });
    }
  }
  if (issues.length > 0) throw new LeafcastError("write", issues);
}

const EXPECTED_ARRAY = {
  float64: { type: Float64Array, name: "Float64Array" },
  int: { type: Int32Array, name: "Int32Array" },
  label: { type: Uint8Array, name: "Uint8Array" },
  category: { type: Int32Array, name: "Int32Array" },
} as const;

function columnSize(column: WrittenColumn): number {
  return column.type === "category" ? column.categories.length : 0;
}

function firstBadLabel(values: Uint8Array, n: number): number {
  for (let i = 0; i < n; i++) if (values[i] > 1) return i;
  return -1;
}

function firstBadCode(codes: Int32Array, n: number, size: number): number {
  for (let i = 0; i < n; i++) {
    const c = codes[i];
    if (c < -1 || c >= size) return i;
  }
  return -1;
}
