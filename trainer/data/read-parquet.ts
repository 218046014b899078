import { parquetMetadataAsync, parquetRead, parquetSchema } from "hyparquet";
import type { AsyncBuffer, DecodedArray, FileMetaData } from "hyparquet";
import { compressors } from "hyparquet-compressors";
import { LeafcastError } from "../errors.js";
import { BatchBuilder } from "./batch-builder.js";
import type { ColumnBatch } from "./column-batch.js";
import { damagedFileError } from "./damaged-file-error.js";
import { feedColumnRows, type ColumnSource } from "./feed-column-rows.js";
import { openFileAsyncBuffer } from "./file-async-buffer.js";
import { CELL_CATEGORY, planColumns } from "./plan-columns.js";
import { columnSourceFromValues } from "./column-source-from-values.js";
import type { ReadContext } from "./read-types.js";

/**
 * Reads a Parquet file row group by row group (any codec hyparquet-compressors
 * knows: Snappy, GZIP, ZSTD, Brotli, LZ4) through a file-backed buffer, so only
 * the footer and one row group's schema columns are in memory at a time; yields
 * them as column batches. Rows are numbered from 1 across the whole file.
 *
 * @example
 * for await (const batch of readParquet(context)) console.log(batch.rowCount);
 */
export async function* readParquet(ctx: ReadContext): AsyncGenerator<ColumnBatch> {
  const file = await openFileAsyncBuffer(ctx.file);
  try {
    if (file.buffer.byteLength === 0) {
      throw new LeafcastError("parquet", [
        {
          code: "empty_file",
          message: "expected a Parquet file, found an empty file",
          file: ctx.file,
        },
      ]);
    }
    const metadata = await decoding(ctx, () => parquetMetadataAsync(file.buffer));
    const names = parquetSchema(metadata).children.map((child) => child.element.name);
    const slots = planColumns(ctx.schema, names, "parquet", ctx.file, ctx.dictionaries);
    const builder = new BatchBuilder(ctx.file, slots, ctx.batchRows, ctx.sink);
    const columns = slots.map((slot) => slot.name);
    let groupStart = 0;
    for (const group of metadata.row_groups) {
      ctx.signal?.throwIfAborted();
      const rows = Number(group.num_rows);
      const data = await decoding(ctx, () =>
        readRowGroup(file.buffer, metadata, columns, groupStart, groupStart + rows),
      );
      const sources = data.map((values, i) => toSource(values, slots[i].cell));
      let at = 0;
      while ((at = feedColumnRows(builder, sources, at, rows, groupStart)) < rows) {
        yield builder.take();
      }
      await ctx.sink.flush();
      groupStart += rows;
    }
    if (builder.rowCount > 0) yield builder.take(true);
  } finally {
    await file.close();
  }
}

/** Decodes the given columns of the rows [start, end) of one row group, one array per column. */
async function readRowGroup(
  file: AsyncBuffer,
  metadata: FileMetaData,
  columns: string[],
  start: number,
  end: number,
): Promise<DecodedArray[]> {
  const pieces = new Map<string, { rowStart: number; data: DecodedArray }[]>();
  for (const column of columns) pieces.set(column, []);
  if (columns.length > 0 && end > start) {
    await parquetRead({
      file,
      metadata,
      columns,
      rowStart: start,
      rowEnd: end,
      compressors,
      onChunk: (chunk) => {
        pieces.get(chunk.columnName)?.push({ rowStart: chunk.rowStart, data: chunk.columnData });
      },
    });
  }
  return columns.map((column) => joinPieces(column, pieces.get(column) ?? [], start, end));
}

/** One array for rows [start, end) from the pieces hyparquet handed over (usually exactly one). */
function joinPieces(
  column: string,
  pieces: { rowStart: number; data: DecodedArray }[],
  start: number,
  end: number,
): DecodedArray {
  const only = pieces[0];
  if (pieces.length === 1 && only.rowStart === start && only.data.length === end - start) {
    return only.data;
  }
  const joined = new Array<unknown>(end - start);
  let filled = 0;
  for (const { rowStart, data } of pieces) {
    for (let i = 0; i < data.length; i++) {
      const at = rowStart + i - start;
      if (at >= 0 && at < joined.length) {
        joined[at] = data[i];
        filled++;
      }
    }
  }
  if (filled !== joined.length) {
    throw new Error(
      `column "${column}" decoded ${filled} of the row group's ${joined.length} values`,
    );
  }
  return joined;
}

function toSource(data: DecodedArray, cell: number): ColumnSource {
  const numeric =
    data instanceof Float64Array ||
    data instanceof Float32Array ||
    data instanceof Int32Array ||
    data instanceof Uint32Array;
  if (numeric && cell !== CELL_CATEGORY) {
    // The kernels read Float64Array only (see column-run-kernels.ts).
    return {
      numbers: data instanceof Float64Array ? data : new Float64Array(data),
      values: null,
      indices: null,
      texts: null,
      codeMap: null,
      valid: null,
      epochMs: false,
      booleans: false,
    };
  }
  return columnSourceFromValues(data, cell, null);
}

/** Runs a decoding step, turning library exceptions into a clear damaged-file error. */
async function decoding<T>(ctx: ReadContext, step: () => Promise<T>): Promise<T> {
  try {
    return await step();
  } catch (error) {
    if (error instanceof LeafcastError) throw error;
    throw damagedFileError("parquet", ctx.file, error);
  }
}
