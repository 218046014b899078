import {
  AsyncByteQueue,
  Dictionary,
  Field,
  Float64,
  Int32,
  RecordBatch,
  RecordBatchFileWriter,
  Schema,
  Struct,
  Uint8,
  Utf8,
  makeData,
  vectorFromArray,
  type Data,
  type DataType,
  type Vector,
} from "apache-arrow";
import {
  checkWrittenBatch,
  checkWrittenColumns,
  type WriteSummary,
  type WrittenBatch,
  type WrittenColumn,
} from "./write-columns.js";
import { writeStreamAtomic } from "../io/write-stream-atomic.js";

/**
 * Streams batches to an Arrow IPC file (the random-access "file" format with
 * a footer), one record batch per batch. Types: float64 -> Float64 (a missing
 * value is null), int -> Int32, label -> Uint8, category ->
 * Dictionary<Utf8, Int32> whose dictionary is the declared category list,
 * written once (every batch shares it, as the file format requires).
 *
 * @example
 * await writeArrow("plots.arrow", [{ name: "open", type: "label" }], [
 *   { rowCount: 2, columns: { open: Uint8Array.of(0, 1) } },
 * ]);
 */
export async function writeArrow(
  path: string,
  columns: readonly WrittenColumn[],
  batches: Iterable<WrittenBatch> | AsyncIterable<WrittenBatch>,
): Promise<WriteSummary> {
  checkWrittenColumns(columns);
  const types = columns.map((column, c) => arrowType(column, c));
  const schema = new Schema(types.map((type, c) => new Field(columns[c].name, type, true)));
  const dictionaries = columns.map((column) =>
    column.type === "category" ? vectorFromArray([...column.categories], new Utf8()) : null,
  );
  let rows = 0;
  const bytes = await writeStreamAtomic(path, async (sink) => {
    const queue = new CollectingQueue();
    const writer = new RecordBatchFileWriter();
    // Given the schema, the writer starts at once, so a file without rows is valid too.
    writer.reset(queue, schema);
    for await (const batch of batches) {
      checkWrittenBatch(columns, batch);
      if (batch.rowCount === 0) continue;
      const children = columns.map((column, c) =>
        columnData(column, types[c], dictionaries[c], batch),
      );
      const data = makeData({
        type: new Struct(schema.fields),
        length: batch.rowCount,
        nullCount: 0,
        children,
      });
      writer.write(new RecordBatch(schema, data));
      // The collected chunks view the batch's own arrays: write them out now.
      for (const chunk of queue.take()) await sink.write(chunk);
      rows += batch.rowCount;
    }
    writer.finish();
    for (const chunk of queue.take()) await sink.write(chunk);
  });
  return { path, rows, bytes };
}

function arrowType(column: WrittenColumn, index: number): DataType {
  switch (column.type) {
    case "float64":
      return new Float64();
    case "int":
      return new Int32();
    case "label":
      return new Uint8();
    case "category":
      return new Dictionary(new Utf8(), new Int32(), index);
  }
}

function columnData(
  column: WrittenColumn,
  type: DataType,
  dictionary: Vector<Utf8> | null,
  batch: WrittenBatch,
): Data {
  const n = batch.rowCount;
  const values = batch.columns[column.name].subarray(0, n);
  if (column.type === "float64") {
    const numbers = values as Float64Array;
    const { nullCount, nullBitmap } = validity(n, (i) => numbers[i] === numbers[i]);
    return makeData({ type: type as Float64, length: n, nullCount, nullBitmap, data: numbers });
  }
  if (column.type === "category" && dictionary !== null) {
    const codes = values as Int32Array;
    const { nullCount, nullBitmap } = validity(n, (i) => codes[i] >= 0);
    return makeData({
      type: type as Dictionary<Utf8, Int32>,
      length: n,
      nullCount,
      nullBitmap,
      // A null slot still needs a valid index for readers that peek at it.
      data: nullCount > 0 ? codes.map((c) => (c < 0 ? 0 : c)) : codes,
      dictionary,
    });
  }
  return makeData({ type: type as Int32 | Uint8, length: n, nullCount: 0, data: values });
}

/** Arrow's validity bitmap (bit set = present), or none when every value is present. */
function validity(
  n: number,
  present: (i: number) => boolean,
): { nullCount: number; nullBitmap: Uint8Array | undefined } {
  let nullCount = 0;
  for (let i = 0; i < n; i++) if (!present(i)) nullCount++;
  if (nullCount === 0) return { nullCount, nullBitmap: undefined };
  const nullBitmap = new Uint8Array((n + 7) >> 3);
  for (let i = 0; i < n; i++) if (present(i)) nullBitmap[i >> 3] |= 1 << (i & 7);
  return { nullCount, nullBitmap };
}

/**
 * The Arrow writer's byte sink: it keeps the chunks until they are taken, so
 * the caller can write them to disk (and await the disk) after every record
 * batch instead of letting an unbounded queue grow.
 */
class CollectingQueue extends AsyncByteQueue {
  private chunks: Uint8Array[] = [];

  override write(value: Uint8Array): void {
    if (value.byteLength > 0) this.chunks.push(value);
  }

  take(): Uint8Array[] {
    const taken = this.chunks;
    this.chunks = [];
    return taken;
  }
}
