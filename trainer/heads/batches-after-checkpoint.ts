import type { ColumnBatch } from "../data/column-batch.js";
import type { DataFileReader } from "../data/read-types.js";
import { LeafcastError } from "../errors.js";

/** Where the rows read so far end: the file being read (0-based) and its rows passed on. */
export interface ReadPosition {
  file: number;
  rows: number;
}

/**
 * The batches of `readers`, in order, from a checkpoint's position on: files
 * before `start.file` are not read at all (the heads' encoding reads category
 * text, not codes, so an unread file changes nothing), and the first
 * `start.rows` rows of that file are read again the same way and dropped.
 * `position` is kept up to date as batches pass, so a checkpoint taken after a
 * batch records exactly where that batch ends. A position that does not fall
 * on a batch boundary is refused (LeafcastError from "checkpoint").
 *
 * @example
 * const position = { file: 0, rows: 0 };
 * for await (const batch of batchesAfterCheckpoint(readers, paths, { file: 1, rows: 65536 }, position)) learn(batch);
 */
export async function* batchesAfterCheckpoint(
  readers: readonly DataFileReader[],
  paths: readonly string[],
  start: { readonly file: number; readonly rows: number },
  position: ReadPosition,
): AsyncGenerator<ColumnBatch> {
  for (let i = start.file; i < readers.length; i++) {
    position.file = i;
    position.rows = 0;
    let skip = i === start.file ? start.rows : 0;
    for await (const batch of readers[i].batches()) {
      position.rows += batch.rowCount;
      if (skip === 0) {
        yield batch;
        continue;
      }
      if (batch.rowCount > skip) throw positionError(paths[i], skip, batch.rowCount);
      skip -= batch.rowCount;
    }
    if (skip > 0) throw positionError(paths[i], skip, 0);
  }
}

function positionError(file: string, skip: number, batchRows: number): LeafcastError {
  const found = batchRows === 0 ? "the end of the file" : `a batch of ${batchRows} rows`;
  return new LeafcastError("checkpoint", [
    {
      code: "bad_position",
      message: `cannot resume: expected to skip ${skip} more rows at a batch boundary, found ${found}; remove the checkpoint (or pass --restart) to start over`,
      file,
    },
  ]);
}
