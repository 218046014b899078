// Row counters and row numbers stay exact past 2^31 and 2^32 rows (issue 7,
// point 6). Reading 2^31 rows takes far too long for a test, so each piece of
// counting code is driven from a starting count just below a 32-bit boundary:
// an Int32Array/Uint32Array counter or a `| 0` would wrap there, a double does
// not until 2^53.
import { rmSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { BatchBuilder } from "../../trainer/data/batch-builder.js";
import { columnSourceFromValues } from "../../trainer/data/column-source-from-values.js";
import { feedColumnRows } from "../../trainer/data/feed-column-rows.js";
import { openDataFile } from "../../trainer/data/open-data-file.js";
import { planColumns } from "../../trainer/data/plan-columns.js";
import type { MutableReadStats } from "../../trainer/data/read-types.js";
import { RejectSink } from "../../trainer/data/reject-sink.js";
import { CsvRowScanner } from "../../trainer/data/scan-csv-rows.js";
import { fuzzSchema } from "./fuzz-schema.js";
import { scratchDir } from "./scratch-dir.js";

const dir = scratchDir("leafcast-hostile-counts-");
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Starting counts just below the boundaries where 32-bit arithmetic wraps, and near the end of exact doubles. */
const starts = [2 ** 31 - 2, 2 ** 32 - 2, 2 ** 40, 2 ** 53 - 8];

function emptyStats(): MutableReadStats {
  return {
    file: "plots.csv",
    rowsAccepted: 0,
    rowsRejected: 0,
    rejectsPath: null,
    rejectedByCode: {},
  };
}

/** A skip-policy sink that remembers the row number of every rejected row. */
class RecordingSink extends RejectSink {
  readonly rows: number[] = [];
  override reject(
    row: number,
    column: string | null,
    code: string,
    reason: string,
    raw: string,
  ): void {
    this.rows.push(row);
    super.reject(row, column, code, reason, raw);
  }
}

describe("row numbers past 2^31", () => {
  it.each(starts)("numbers CSV rows exactly after %d rows", (start) => {
    const header = ["x", "crop", "open"];
    const slots = planColumns(fuzzSchema, header, "csv", "plots.csv");
    const sink = new RecordingSink("csv", "plots.csv", "skip", emptyStats(), null);
    const builder = new BatchBuilder("plots.csv", slots, 16, sink);
    const fieldSlots = new Int32Array(header.length).fill(-1);
    slots.forEach((slot, i) => (fieldSlots[slot.fileIndex] = i));
    const scanner = new CsvRowScanner(builder, fieldSlots, header);
    scanner.row = start;
    // Rows start+1 .. start+5: bad, good, blank (counted), bad, good.
    const text = Buffer.from("n/a,kale,1\n1,kale,0\n\n2,leek,7\n3,okra,1\n");
    expect(scanner.scan(text, 0, text.length, true)).toBe(text.length);
    expect(sink.rows).toEqual([start + 1, start + 4]);
    expect(scanner.row).toBe(start + 5);
    expect(builder.rowCount).toBe(2);
  });

  it.each(starts)("numbers Parquet and Arrow rows exactly from a row base of %d", (start) => {
    const slots = planColumns(fuzzSchema, ["x", "crop", "open"], "parquet", "plots.parquet");
    const sink = new RecordingSink("parquet", "plots.parquet", "skip", emptyStats(), null);
    const builder = new BatchBuilder("plots.parquet", slots, 16, sink);
    const sources = [
      columnSourceFromValues([1, 2, 3, 4], slots[0].cell, null),
      columnSourceFromValues(["kale", "leek", "okra", "kale"], slots[1].cell, null),
      columnSourceFromValues([1, 0, 5, 1], slots[2].cell, null),
    ];
    expect(feedColumnRows(builder, sources, 0, 4, start)).toBe(4);
    expect(sink.rows).toEqual([start + 3]);
    expect(builder.rowCount).toBe(3);
  });

  it.each(starts)("counts rejected rows and codes exactly from %d", (start) => {
    const stats = emptyStats();
    stats.rowsRejected = start;
    stats.rejectedByCode.not_a_number = start;
    const sink = new RejectSink("csv", "plots.csv", "skip", stats, null);
    for (let i = 0; i < 3; i++) sink.reject(start + i, "x", "not_a_number", "found n/a", "n/a");
    expect(stats.rowsRejected).toBe(start + 3);
    expect(stats.rejectedByCode.not_a_number).toBe(start + 3);
  });

  it.each(starts)("adds accepted rows to a read's count exactly from %d", async (start) => {
    const path = join(dir, "three.csv");
    writeFileSync(path, "x,crop,open\n1,kale,1\n2,leek,0\n3,okra,1\n");
    const reader = openDataFile(path, fuzzSchema, { batchRows: 2 });
    // The stats object is the live counter the read adds to: start it high instead of reading 2^31 rows.
    (reader.stats as MutableReadStats).rowsAccepted = start;
    for await (const batch of reader.batches()) expect(batch.rowCount).toBeGreaterThan(0);
    expect(reader.stats.rowsAccepted).toBe(start + 3);
  });
});
