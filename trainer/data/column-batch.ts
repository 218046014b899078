import type { CategoryDictionary } from "./category-dictionary.js";

/**
 * One column of a batch, as typed arrays. Missing numbers are NaN; missing
 * categories are code -1. Timestamps are milliseconds since the Unix epoch.
 */
export type ColumnData =
  /** numeric features, weights, timestamps and true probabilities */
  | { readonly kind: "number"; readonly values: Float64Array }
  /** outcome labels, 0 or 1 */
  | { readonly kind: "label"; readonly values: Uint8Array }
  /** categorical features and group ids */
  | {
      readonly kind: "category";
      readonly codes: Int32Array;
      readonly dictionary: CategoryDictionary;
    };

/**
 * The unit every reader yields: a run of accepted rows of one file, column by
 * column. Rows rejected by the bad-row policy are not in it (they are counted in
 * the read's statistics and written aside).
 */
export interface ColumnBatch {
  /** The file the rows came from. */
  readonly file: string;
  readonly rowCount: number;
  /** Keyed by column name; holds every column of the dataset schema that the file has, except role "ignore". */
  readonly columns: ReadonlyMap<string, ColumnData>;
}

/** The numbers of a column, or a clear error when the column is not numeric. */
export function numberColumn(batch: ColumnBatch, name: string): Float64Array {
  const column = batch.columns.get(name);
  if (column === undefined) throw new Error(`batch: no column "${name}" in ${batch.file}`);
  if (column.kind !== "number") {
    throw new Error(`batch: column "${name}" expected numbers, found ${column.kind}s`);
  }
  return column.values;
}

/** The 0/1 labels of an outcome column. */
export function labelColumn(batch: ColumnBatch, name: string): Uint8Array {
  const column = batch.columns.get(name);
  if (column === undefined) throw new Error(`batch: no column "${name}" in ${batch.file}`);
  if (column.kind !== "label") {
    throw new Error(`batch: column "${name}" expected labels, found ${column.kind}s`);
  }
  return column.values;
}

/** The codes and dictionary of a categorical column. */
export function categoryColumn(
  batch: ColumnBatch,
  name: string,
): { readonly codes: Int32Array; readonly dictionary: CategoryDictionary } {
  const column = batch.columns.get(name);
  if (column === undefined) throw new Error(`batch: no column "${name}" in ${batch.file}`);
  if (column.kind !== "category") {
    throw new Error(`batch: column "${name}" expected categories, found ${column.kind}s`);
  }
  return column;
}
