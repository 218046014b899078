import { LeafcastError } from "../errors.js";
import { BatchBuilder } from "./batch-builder.js";
import type { ColumnBatch } from "./column-batch.js";
import { FileChunks } from "./file-chunks.js";
import { parseCsvHeader } from "./parse-csv-header.js";
import { planColumns } from "./plan-columns.js";
import { recordTooLongError } from "./record-too-long-error.js";
import type { ReadContext } from "./read-types.js";
import { CsvRowScanner } from "./scan-csv-rows.js";

/**
 * Streams a CSV file (RFC 4180: a header row, comma-separated fields, quoted
 * fields with doubled quotes and line breaks inside, CRLF or LF, an optional
 * UTF-8 byte order mark) as column batches. Only one batch and one read chunk
 * are in memory at a time.
 *
 * Rows are numbered from 1 at the first record after the header (the header is
 * not counted); blank lines are skipped but counted, so "row 17" is line 18 of
 * a file without quoted line breaks. A cell of a schema column whose bytes are
 * not UTF-8 makes its row bad ("invalid_utf8"); a header that is not UTF-8, or
 * has a quote left open or text after a closing quote, is a file-level error.
 *
 * @example
 * for await (const batch of readCsv(context)) console.log(batch.rowCount);
 */
export async function* readCsv(ctx: ReadContext): AsyncGenerator<ColumnBatch> {
  const chunks = await FileChunks.open(ctx.file, ctx.chunkBytes);
  try {
    let builder: BatchBuilder | null = null;
    let scanner: CsvRowScanner | null = null;
    while (await chunks.more()) {
      ctx.signal?.throwIfAborted();
      if (scanner === null || builder === null) {
        const header = readHeader(ctx.file, chunks);
        if (header === null) {
          if (chunks.end > ctx.maxRecordBytes)
            throw recordTooLongError("csv", ctx.file, ctx.maxRecordBytes, null);
          continue;
        }
        const slots = planColumns(ctx.schema, header.names, "csv", ctx.file, ctx.dictionaries);
        builder = new BatchBuilder(ctx.file, slots, ctx.batchRows, ctx.sink);
        const fieldSlots = new Int32Array(header.names.length).fill(-1);
        slots.forEach((slot, i) => (fieldSlots[slot.fileIndex] = i));
        scanner = new CsvRowScanner(builder, fieldSlots, header.names);
        chunks.start = header.next;
      }
      while (true) {
        chunks.start = scanner.scan(chunks.buf, chunks.start, chunks.end, chunks.eof);
        if (!builder.full) break;
        yield builder.take();
      }
      // What the scanner left is one record cut by the end of the bytes read so far.
      if (chunks.end - chunks.start > ctx.maxRecordBytes)
        throw recordTooLongError("csv", ctx.file, ctx.maxRecordBytes, scanner.row + 1);
      await ctx.sink.flush();
    }
    if (builder !== null && builder.rowCount > 0) yield builder.take(true);
  } finally {
    await chunks.close();
  }
}

/** The header at the start of the file, or null while it may still be cut off. */
function readHeader(file: string, chunks: FileChunks): { names: string[]; next: number } | null {
  const { buf, end, eof } = chunks;
  if (end < 3 && !eof) return null;
  const skip = end >= 3 && buf[0] === 0xef && buf[1] === 0xbb && buf[2] === 0xbf ? 3 : 0;
  if (end === skip) {
    if (!eof) return null;
    throw emptyFile(file, "an empty file");
  }
  const header = parseCsvHeader(buf.subarray(skip, end), eof);
  if (header === null) return null;
  if (header.problem !== null) {
    throw new LeafcastError("csv", [{ code: "bad_header", message: header.problem, file }]);
  }
  if (header.names.length === 1 && header.names[0] === "")
    throw emptyFile(file, "a blank first line");
  return { names: header.names, next: skip + header.next };
}

function emptyFile(file: string, found: string): LeafcastError {
  return new LeafcastError("csv", [
    { code: "empty_file", message: `expected a header row, found ${found}`, file },
  ]);
}
