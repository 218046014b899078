import { isUtf8 } from "node:buffer";
import { LeafcastError } from "../errors.js";
import { BatchBuilder } from "./batch-builder.js";
import type { ColumnBatch } from "./column-batch.js";
import { FileChunks } from "./file-chunks.js";
import { planColumns } from "./plan-columns.js";
import { recordTooLongError } from "./record-too-long-error.js";
import type { ReadContext } from "./read-types.js";

const LF = 10;
const blank = /^[ \t\r\n]*$/;
const hasOwn = Object.prototype.hasOwnProperty;

/**
 * Streams an NDJSON file (one JSON object a line, UTF-8, LF or CRLF) as column
 * batches. The file's columns are the schema columns among the keys of its
 * first object; a key missing from a later object is a missing cell there, and
 * keys the schema does not list are ignored.
 *
 * Rows are numbered by line (1-based); blank lines are skipped but counted, so
 * a row number is always the line to look at. A line that is not valid JSON, or
 * not an object, or not UTF-8, is a bad row.
 *
 * @example
 * for await (const batch of readNdjson(context)) console.log(batch.rowCount);
 */
export async function* readNdjson(ctx: ReadContext): AsyncGenerator<ColumnBatch> {
  const chunks = await FileChunks.open(ctx.file, ctx.chunkBytes);
  const reader = new NdjsonLines(ctx);
  let bomChecked = false;
  try {
    while (await chunks.more()) {
      ctx.signal?.throwIfAborted();
      const { buf, end, eof } = chunks;
      if (!bomChecked) {
        if (end < 3 && !eof) continue;
        if (end >= 3 && buf[0] === 0xef && buf[1] === 0xbb && buf[2] === 0xbf) chunks.start = 3;
        bomChecked = true;
      }
      let at = chunks.start;
      while (at < end) {
        let newline = buf.indexOf(LF, at);
        if (newline < 0 || newline >= end) {
          if (!eof) break;
          newline = end;
        }
        reader.line(buf, at, newline);
        at = Math.min(newline + 1, end);
        chunks.start = at;
        if (reader.builder?.full === true) yield reader.builder.take();
      }
      // What is left is one line cut by the end of the bytes read so far.
      if (chunks.end - chunks.start > ctx.maxRecordBytes)
        throw recordTooLongError("ndjson", ctx.file, ctx.maxRecordBytes, reader.lineNumber + 1);
      await ctx.sink.flush();
    }
    if (reader.builder === null && !reader.sawLine) {
      throw new LeafcastError("ndjson", [
        {
          code: "empty_file",
          message: "expected JSON objects, found an empty file",
          file: ctx.file,
        },
      ]);
    }
    if (reader.builder !== null && reader.builder.rowCount > 0) yield reader.builder.take(true);
  } finally {
    await chunks.close();
  }
}

/** Turns lines into rows of the batch builder; creates the builder at the first object. */
class NdjsonLines {
  builder: BatchBuilder | null = null;
  sawLine = false;
  /** Lines seen so far (the 1-based number of the last one). */
  lineNumber = 0;
  private names: string[] = [];

  constructor(private readonly ctx: ReadContext) {}

  line(buf: Buffer, start: number, end: number): void {
    this.lineNumber++;
    let stop = end;
    if (stop > start && buf[stop - 1] === 13) stop--;
    const text = buf.toString("utf8", start, stop);
    // Only JSON's own whitespace makes a blank line: a line of U+00A0 or U+FEFF is not JSON.
    if (blank.test(text)) return;
    this.sawLine = true;
    // U+FFFD may stand for bytes that are not UTF-8: refuse those, or two different
    // broken category values would silently become one.
    if (text.includes("\uFFFD") && !isUtf8(buf.subarray(start, stop))) {
      this.reject("invalid_utf8", "expected UTF-8 text, found bytes that are not UTF-8", text);
      return;
    }
    let record: unknown;
    try {
      record = JSON.parse(text);
    } catch (error) {
      const reason = error instanceof Error ? error.message : String(error);
      this.reject("invalid_json", `expected a JSON object, found invalid JSON (${reason})`, text);
      return;
    }
    if (typeof record !== "object" || record === null || Array.isArray(record)) {
      const kind = Array.isArray(record) ? "an array" : record === null ? "null" : typeof record;
      this.reject("not_an_object", `expected a JSON object, found ${kind}`, text);
      return;
    }
    const b = this.builder ?? this.begin(record);
    const names = this.names;
    for (let slot = 0; slot < names.length; slot++) {
      const name = names[slot];
      b.valueCell(
        slot,
        hasOwn.call(record, name) ? (record as Record<string, unknown>)[name] : undefined,
      );
    }
    if (b.rowBad) b.rejectRow(this.lineNumber, text);
    else b.commitRow();
  }

  private begin(record: object): BatchBuilder {
    const ctx = this.ctx;
    const slots = planColumns(
      ctx.schema,
      Object.keys(record),
      "ndjson",
      ctx.file,
      ctx.dictionaries,
    );
    this.names = slots.map((slot) => slot.name);
    this.builder = new BatchBuilder(ctx.file, slots, ctx.batchRows, ctx.sink);
    return this.builder;
  }

  private reject(code: string, reason: string, raw: string): void {
    if (this.builder !== null) {
      this.builder.failRow(code, reason, null);
      this.builder.rejectRow(this.lineNumber, raw);
    } else {
      this.ctx.sink.reject(this.lineNumber, null, code, reason, raw);
    }
  }
}
