import type { CategoryDictionary } from "../data/category-dictionary.js";
import type { ColumnBatch, ColumnData } from "../data/column-batch.js";
import type { ResolvedSchema } from "../schema/load-dataset-schema.js";
import type { SampleRows } from "./read-pruning-sample.js";

/**
 * One side of a pruning sample as column batches of at most `batchRows` rows, in
 * sample order, with the columns of `schema` the rows hold (features, outcomes,
 * weight, timestamp). Every column is a subarray view: nothing is copied.
 *
 * @example
 * for (const batch of sampleBatches(sample.train, sample.dictionaries, schema, 65536)) encode(batch);
 */
export function* sampleBatches(
  rows: SampleRows,
  dictionaries: ReadonlyMap<string, CategoryDictionary>,
  schema: ResolvedSchema,
  batchRows: number,
): Generator<ColumnBatch> {
  for (let start = 0; start < rows.rowCount; start += batchRows) {
    const end = Math.min(rows.rowCount, start + batchRows);
    const columns = new Map<string, ColumnData>();
    for (const name of schema.numeric) {
      const values = rows.numbers.get(name);
      if (values !== undefined)
        columns.set(name, { kind: "number", values: values.subarray(start, end) });
    }
    for (const name of schema.categorical) {
      const codes = rows.codes.get(name);
      const dictionary = dictionaries.get(name);
      if (codes !== undefined && dictionary !== undefined) {
        columns.set(name, { kind: "category", codes: codes.subarray(start, end), dictionary });
      }
    }
    for (const name of schema.outcomes) {
      const values = rows.labels.get(name);
      if (values !== undefined)
        columns.set(name, { kind: "label", values: values.subarray(start, end) });
    }
    if (schema.weight !== null && rows.weight !== null) {
      columns.set(schema.weight, { kind: "number", values: rows.weight.subarray(start, end) });
    }
    if (schema.timestamp !== null && rows.timestamp !== null) {
      columns.set(schema.timestamp, {
        kind: "number",
        values: rows.timestamp.subarray(start, end),
      });
    }
    yield { file: "<pruning sample>", rowCount: end - start, columns };
  }
}
