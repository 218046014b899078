/**
 * One column of a columnar batch. Numeric features: kind "number" with a
 * Float64Array (NaN: missing). Categorical features: kind "category" with an
 * Int32Array of codes (-1: missing) into a dictionary whose list() gives the text
 * of each code. The trainer's ColumnBatch columns have exactly this shape; other
 * kinds (labels, weights) are ignored.
 *
 * A dictionary may grow between batches but must not change the text of a code
 * it has listed: the scorer caches per-code work (tree codes, hash buckets) for
 * as long as it sees the same list.
 */
export interface ColumnInput {
  readonly kind: string;
  readonly values?: ArrayLike<number>;
  readonly codes?: Int32Array;
  readonly dictionary?: { list(): readonly string[] };
}

/**
 * A batch of rows, column by column, keyed by feature name.
 *
 * @example
 * const batch: ColumnarBatch = {
 *   rowCount: 2,
 *   columns: new Map([
 *     ["tie_strength", { kind: "number", values: Float64Array.of(0.4, NaN) }],
 *     ["crop", { kind: "category", codes: Int32Array.of(0, -1), dictionary: { list: () => ["kale"] } }],
 *   ]),
 * };
 */
export interface ColumnarBatch {
  readonly rowCount: number;
  readonly columns: ReadonlyMap<string, ColumnInput>;
}
