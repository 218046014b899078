import { ByteWriter, ParquetWriter, type ColumnSource, type SchemaElement } from "hyparquet-writer";
import {
  checkWrittenBatch,
  checkWrittenColumns,
  type WriteSummary,
  type WrittenBatch,
  type WrittenColumn,
} from "./write-columns.js";
import { writeStreamAtomic, type ByteSink } from "../io/write-stream-atomic.js";

/**
 * Streams batches to a Parquet file, one row group per batch, so memory stays
 * at about one batch whatever the file size. Types: float64 -> DOUBLE
 * (OPTIONAL; a missing value is null), int -> INT32, label -> INT32 (0/1),
 * category -> UTF8 string (OPTIONAL; the writer dictionary-encodes it).
 * Compression: Snappy.
 *
 * @example
 * await writeParquet("plots.parquet", [{ name: "open", type: "label" }], [
 *   { rowCount: 2, columns: { open: Uint8Array.of(0, 1) } },
 * ]);
 */
export async function writeParquet(
  path: string,
  columns: readonly WrittenColumn[],
  batches: Iterable<WrittenBatch> | AsyncIterable<WrittenBatch>,
): Promise<WriteSummary> {
  checkWrittenColumns(columns);
  let rows = 0;
  const bytes = await writeStreamAtomic(path, async (sink) => {
    const writer = new ParquetWriter({
      writer: new SinkByteWriter(sink),
      schema: parquetSchema(columns),
      createdBy: "leafcast",
    });
    for await (const batch of batches) {
      checkWrittenBatch(columns, batch);
      if (batch.rowCount === 0) continue;
      const columnData = columns.map((column) => columnSource(column, batch));
      await writer.write({ columnData, rowGroupSize: batch.rowCount });
      rows += batch.rowCount;
    }
    await writer.finish();
  });
  return { path, rows, bytes };
}

function parquetSchema(columns: readonly WrittenColumn[]): SchemaElement[] {
  const root: SchemaElement = { name: "root", num_children: columns.length };
  return [
    root,
    ...columns.map((column): SchemaElement => {
      switch (column.type) {
        case "float64":
          return { name: column.name, type: "DOUBLE", repetition_type: "OPTIONAL" };
        case "int":
        case "label":
          return { name: column.name, type: "INT32", repetition_type: "REQUIRED" };
        case "category":
          return {
            name: column.name,
            type: "BYTE_ARRAY",
            converted_type: "UTF8",
            repetition_type: "OPTIONAL",
          };
      }
    }),
  ];
}

/** The values of one row group; missing values become nulls. */
function columnSource(column: WrittenColumn, batch: WrittenBatch): ColumnSource {
  const n = batch.rowCount;
  const values = batch.columns[column.name].subarray(0, n);
  if (column.type === "category") {
    const codes = values as Int32Array;
    const texts: (string | null)[] = new Array<string | null>(n);
    for (let i = 0; i < n; i++) texts[i] = codes[i] >= 0 ? column.categories[codes[i]] : null;
    return { name: column.name, data: texts };
  }
  if (column.type === "float64") {
    const numbers = values as Float64Array;
    let hasMissing = false;
    for (let i = 0; i < n && !hasMissing; i++) hasMissing = numbers[i] !== numbers[i];
    if (!hasMissing) return { name: column.name, data: numbers };
    const withNulls: (number | null)[] = new Array<number | null>(n);
    for (let i = 0; i < n; i++) withNulls[i] = numbers[i] === numbers[i] ? numbers[i] : null;
    return { name: column.name, data: withNulls };
  }
  return { name: column.name, data: values };
}

/**
 * A hyparquet-writer byte writer that hands its buffer to the sink after every
 * row group (the ParquetWriter awaits the returned promise before it encodes
 * the next group), so the buffer never holds more than one row group.
 */
class SinkByteWriter extends ByteWriter {
  private readonly sink: ByteSink;

  constructor(sink: ByteSink) {
    super(1 << 20);
    this.sink = sink;
  }

  async flush(): Promise<void> {
    await this.sink.write(new Uint8Array(this.buffer, 0, this.index));
    this.index = 0;
  }

  override async finish(): Promise<void> {
    await this.flush();
  }
}
