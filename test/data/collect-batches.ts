import type { ColumnBatch } from "../../trainer/data/column-batch.js";

/** A read's batches decoded to plain JSON (NaN as null, category codes as their texts), for golden comparisons. */
export interface DecodedColumns {
  rowCount: number;
  batchSizes: number[];
  columns: Record<string, { kind: string; values: (number | string | null)[] }>;
}

/** Drains batches into one decoded table, checking on the way that every batch is self-consistent. */
export async function collectBatches(batches: AsyncIterable<ColumnBatch>): Promise<DecodedColumns> {
  const out: DecodedColumns = { rowCount: 0, batchSizes: [], columns: {} };
  for await (const batch of batches) {
    out.rowCount += batch.rowCount;
    out.batchSizes.push(batch.rowCount);
    for (const [name, column] of batch.columns) {
      const target = (out.columns[name] ??= { kind: column.kind, values: [] });
      if (column.kind === "number") {
        if (column.values.length !== batch.rowCount)
          throw new Error(`${name}: length ${column.values.length}`);
        for (const v of column.values) target.values.push(Number.isNaN(v) ? null : v);
      } else if (column.kind === "label") {
        if (column.values.length !== batch.rowCount)
          throw new Error(`${name}: length ${column.values.length}`);
        for (const v of column.values) target.values.push(v);
      } else {
        if (column.codes.length !== batch.rowCount)
          throw new Error(`${name}: length ${column.codes.length}`);
        for (const code of column.codes)
          target.values.push(code < 0 ? null : column.dictionary.valueOf(code));
      }
    }
  }
  return out;
}
