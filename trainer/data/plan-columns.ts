import { LeafcastError, type Issue } from "../errors.js";
import type { ResolvedColumn, ResolvedSchema } from "../schema/load-dataset-schema.js";
import { CategoryDictionary } from "./category-dictionary.js";

/** How a cell is checked and stored; one value per column role (timestamps per unit). */
export const CELL_NUMBER = 0;
export const CELL_WEIGHT = 1;
export const CELL_PROBABILITY = 2;
export const CELL_LABEL = 3;
export const CELL_TIME_S = 4;
export const CELL_TIME_MS = 5;
export const CELL_TIME_ISO = 6;
export const CELL_CATEGORY = 7;

/** A schema column that the file has: where it sits in the file and how its cells are read. */
export interface ColumnSlot {
  readonly name: string;
  readonly column: ResolvedColumn;
  /** One of the CELL_* constants. */
  readonly cell: number;
  /** Position among the file's columns (CSV header field, Parquet/Arrow field). */
  readonly fileIndex: number;
  /** For categorical and group columns: the dictionary their codes refer to. */
  readonly dictionary: CategoryDictionary | null;
}

/**
 * Matches the file's columns against the schema, in schema order. Columns the
 * schema does not list, and columns of role "ignore", are read past. A required
 * schema column that the file lacks, or a schema column the file names twice, is
 * a file-level error (all of them gathered, thrown once).
 *
 * Categorical and group columns take their dictionary from `dictionaries` when it
 * holds one for the column, and otherwise put a new one there, so several files
 * read with the same map share codes.
 *
 * @example
 * const slots = planColumns(schema, ["plot_id", "tie_strength", "open"], "csv", "plots.csv");
 * slots.map((s) => s.name); // ["tie_strength", "open"] when plot_id is not in the schema
 */
export function planColumns(
  schema: ResolvedSchema,
  fileColumns: readonly string[],
  source: string,
  file: string,
  dictionaries?: Map<string, CategoryDictionary>,
): ColumnSlot[] {
  const positions = new Map<string, number>();
  // Counted in one pass: a hostile header may repeat a name a million times.
  const repeats = new Map<string, number>();
  const issues: Issue[] = [];
  fileColumns.forEach((name, index) => {
    if (!schema.byName.has(name)) return;
    if (positions.has(name)) repeats.set(name, (repeats.get(name) ?? 1) + 1);
    positions.set(name, index);
  });
  for (const [name, count] of repeats) {
    issues.push({
      code: "duplicate_column",
      message: `column "${name}" expected once, found ${count} times`,
      file,
      column: name,
    });
  }
  const slots: ColumnSlot[] = [];
  for (const column of schema.columns) {
    if (column.role === "ignore") continue;
    const fileIndex = positions.get(column.name);
    if (fileIndex === undefined) {
      if (column.required) {
        issues.push({
          code: "missing_column",
          message: `column "${column.name}" is required by the schema, found no such column in the file`,
          file,
          column: column.name,
        });
      }
      continue;
    }
    const cell = cellOf(column);
    let dictionary: CategoryDictionary | null = null;
    if (cell === CELL_CATEGORY) {
      dictionary = dictionaries?.get(column.name) ?? new CategoryDictionary();
      dictionaries?.set(column.name, dictionary);
    }
    slots.push({ name: column.name, column, cell, fileIndex, dictionary });
  }
  if (issues.length > 0) throw new LeafcastError(source, issues);
  return slots;
}

function cellOf(column: ResolvedColumn): number {
  switch (column.role) {
    case "numeric":
      return CELL_NUMBER;
    case "weight":
      return CELL_WEIGHT;
    case "true_probability":
      return CELL_PROBABILITY;
    case "outcome":
      return CELL_LABEL;
    case "timestamp":
      return column.timeUnit === "iso"
        ? CELL_TIME_ISO
        : column.timeUnit === "ms"
          ? CELL_TIME_MS
          : CELL_TIME_S;
    case "categorical":
    case "group":
      return CELL_CATEGORY;
    default:
      throw new Error(`plan: role ${column.role} has no cell reader`);
  }
}
