import { open, type FileHandle } from "node:fs/promises";
import {
  DataType,
  Precision,
  RecordBatchReader,
  type Float,
  type Int,
  type RecordBatch,
  type Vector,
} from "apache-arrow";
import { LeafcastError } from "../errors.js";
import { BatchBuilder } from "./batch-builder.js";
import type { ColumnBatch } from "./column-batch.js";
import { damagedFileError } from "./damaged-file-error.js";
import { feedColumnRows, type ColumnSource } from "./feed-column-rows.js";
import { CELL_CATEGORY, planColumns } from "./plan-columns.js";
import { columnSourceFromValues } from "./column-source-from-values.js";
import type { ReadContext } from "./read-types.js";

/**
 * Reads an Arrow IPC file, in either the file format (random access: record
 * batches are read one at a time through the footer's index) or the stream
 * format (messages read in order), from an open file handle, so one record
 * batch at a time is in memory. Yields column batches of `batchRows` rows;
 * rows are numbered from 1 across the whole file.
 *
 * @example
 * for await (const batch of readArrow(context)) console.log(batch.rowCount);
 */
export async function* readArrow(ctx: ReadContext): AsyncGenerator<ColumnBatch> {
  const handle = await open(ctx.file, "r");
  try {
    if ((await handle.stat()).size === 0) {
      throw new LeafcastError("arrow", [
        {
          code: "empty_file",
          message: "expected an Arrow IPC file, found an empty file",
          file: ctx.file,
        },
      ]);
    }
    const reader = await decoding(ctx, async () => {
      const opened = await RecordBatchReader.from(handle as FileHandle);
      return await opened.open();
    });
    // A stream too short to hold a schema message reads as "no batches" in the library.
    if (reader.schema === undefined || reader.schema === null) {
      throw damagedFileError("arrow", ctx.file, new Error("no schema message"));
    }
    const names = reader.schema.fields.map((field) => field.name);
    const slots = planColumns(ctx.schema, names, "arrow", ctx.file, ctx.dictionaries);
    const builder = new BatchBuilder(ctx.file, slots, ctx.batchRows, ctx.sink);
    const iterator = reader[Symbol.asyncIterator]();
    let rowBase = 0;
    while (true) {
      ctx.signal?.throwIfAborted();
      const next = await decoding(ctx, () => iterator.next());
      if (next.done === true) break;
      const batch = next.value as RecordBatch;
      const rows = batch.numRows;
      const sources = slots.map((slot) => toSource(batch, slot.fileIndex, slot.cell));
      let at = 0;
      while ((at = feedColumnRows(builder, sources, at, rows, rowBase)) < rows) {
        yield builder.take();
      }
      await ctx.sink.flush();
      rowBase += rows;
    }
    if (builder.rowCount > 0) yield builder.take(true);
  } finally {
    await handle.close();
  }
}

function toSource(batch: RecordBatch, index: number, cell: number): ColumnSource {
  const vector = batch.getChildAt(index) as Vector;
  const type = vector.type as DataType;
  const n = vector.length;
  let valid: Uint8Array | null = null;
  if (vector.nullCount > 0) {
    valid = new Uint8Array(n);
    for (let i = 0; i < n; i++) valid[i] = vector.isValid(i) ? 1 : 0;
  }
  const plainFloat = DataType.isFloat(type) && (type as Float).precision !== Precision.HALF;
  const plainInt = DataType.isInt(type) && (type as Int).bitWidth <= 32;
  if ((plainFloat || plainInt) && cell !== CELL_CATEGORY) {
    // The kernels read Float64Array only (see column-run-kernels.ts).
    const raw = vector.toArray() as Float64Array | Float32Array | Int32Array;
    const numbers = raw instanceof Float64Array ? raw : new Float64Array(raw);
    return {
      numbers,
      values: null,
      indices: null,
      texts: null,
      codeMap: null,
      valid,
      epochMs: false,
      booleans: false,
    };
  }
  const data = vector.data;
  if (DataType.isDictionary(type) && DataType.isUtf8(type.dictionary) && data.length === 1) {
    // Each dictionary entry is coded once, not once per row.
    const texts = data[0].dictionary?.toArray() as (string | null)[] | undefined;
    const raw = data[0].values as Int32Array | Int16Array | Int8Array | Uint32Array;
    const indices = raw instanceof Int32Array ? raw : new Int32Array(raw);
    if (texts !== undefined) {
      return {
        numbers: null,
        values: null,
        indices,
        texts,
        codeMap: new Int32Array(texts.length).fill(-1),
        valid,
        epochMs: false,
        booleans: false,
      };
    }
  }
  if (DataType.isTimestamp(type) || DataType.isDate(type)) {
    // Arrow gives timestamps and dates as epoch milliseconds (or Dates in older versions).
    const ms = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const value: unknown = vector.get(i);
      ms[i] = value instanceof Date ? value.getTime() : Number(value);
    }
    return {
      numbers: ms,
      values: null,
      indices: null,
      texts: null,
      codeMap: null,
      valid,
      epochMs: true,
      booleans: false,
    };
  }
  const values = new Array<unknown>(n);
  for (let i = 0; i < n; i++) values[i] = vector.get(i);
  return columnSourceFromValues(values, cell, valid);
}

/** Runs a decoding step, turning library exceptions into a clear damaged-file error. */
async function decoding<T>(ctx: ReadContext, step: () => Promise<T>): Promise<T> {
  try {
    return await step();
  } catch (error) {
    if (error instanceof LeafcastError) throw error;
    throw damagedFileError("arrow", ctx.file, error);
  }
}
