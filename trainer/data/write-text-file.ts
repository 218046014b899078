import {
  checkWrittenBatch,
  checkWrittenColumns,
  type WriteSummary,
  type WrittenBatch,
  type WrittenColumn,
  type WrittenValues,
} from "./write-columns.js";
import { planTextRows, writeTextRows, type TextRowLayout } from "./write-text-rows.js";
import { writeStreamAtomic } from "../io/write-stream-atomic.js";

/**
 * The shared driver of the text writers (CSV, NDJSON): writes `header`, then
 * each batch as rows into one of two reused byte buffers, streaming to a temporary file
 * that is renamed into place at the end. Memory stays at one batch of text.
 *
 * @example
 * await writeTextFile("log.csv", columns, batches, csvLayout, "a,b\n");
 */
export async function writeTextFile(
  path: string,
  columns: readonly WrittenColumn[],
  batches: Iterable<WrittenBatch> | AsyncIterable<WrittenBatch>,
  layout: TextRowLayout,
  header: string,
): Promise<WriteSummary> {
  checkWrittenColumns(columns);
  const plan = planTextRows(columns, layout);
  let rows = 0;
  const bytes = await writeStreamAtomic(path, async (sink) => {
    if (header.length > 0) await sink.write(new TextEncoder().encode(header));
    // Two buffers in turn: while one is on its way to disk (in libuv's thread
    // pool), the next batch is encoded into the other.
    const buffers = [new Uint8Array(0), new Uint8Array(0)];
    let turn = 0;
    let pending: Promise<void> = Promise.resolve();
    try {
      for await (const batch of batches) {
        checkWrittenBatch(columns, batch);
        const values: WrittenValues[] = columns.map((column) => batch.columns[column.name]);
        const needed = batch.rowCount * plan.maxRowBytes;
        if (buffers[turn].length < needed) buffers[turn] = new Uint8Array(needed);
        const out = buffers[turn];
        const used = writeTextRows(plan, values, batch.rowCount, out);
        await pending;
        pending = sink.write(out.subarray(0, used));
        turn = 1 - turn;
        rows += batch.rowCount;
      }
    } finally {
      // Never leave a write running (or its rejection unhandled) behind an error.
      await pending.catch(() => undefined);
    }
    await pending;
  });
  return { path, rows, bytes };
}
