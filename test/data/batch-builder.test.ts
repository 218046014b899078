import { describe, expect, it } from "vitest";
import { BatchBuilder } from "../../trainer/data/batch-builder.js";
import { planColumns } from "../../trainer/data/plan-columns.js";
import type { MutableReadStats, RejectRecord } from "../../trainer/data/read-types.js";
import { RejectSink } from "../../trainer/data/reject-sink.js";
import type { RejectsWriter } from "../../trainer/data/rejects-writer.js";
import { resolveDatasetSchema } from "../../trainer/schema/load-dataset-schema.js";

const schema = resolveDatasetSchema({
  name: "builder-test",
  missing: ["", "-999"],
  columns: [
    { name: "x", role: "numeric" },
    { name: "crop", role: "categorical" },
    { name: "open", role: "outcome" },
    { name: "at", role: "timestamp", timeUnit: "ms" },
    { name: "p", role: "true_probability", outcome: "open" },
  ],
});

function setup(): {
  b: BatchBuilder;
  records: RejectRecord[];
  stats: MutableReadStats;
  sink: RejectSink;
} {
  const stats: MutableReadStats = {
    file: "t",
    rowsAccepted: 0,
    rowsRejected: 0,
    rejectsPath: null,
    rejectedByCode: {},
  };
  const records: RejectRecord[] = [];
  const writer = {
    write: async (r: readonly RejectRecord[]) => void records.push(...r),
  } as unknown as RejectsWriter;
  const sink = new RejectSink("test", "t", "skip", stats, writer);
  const slots = planColumns(schema, ["x", "crop", "open", "at", "p"], "test", "t");
  return { b: new BatchBuilder("t", slots, 4, sink), records, stats, sink };
}

function row(b: BatchBuilder, values: unknown[], n: number): void {
  values.forEach((v, slot) => b.valueCell(slot, v));
  if (b.rowBad) b.rejectRow(n, JSON.stringify(values));
  else b.commitRow();
}

describe("BatchBuilder", () => {
  it("checks each value by its column's role", async () => {
    const { b, records, stats, sink } = setup();
    row(b, [1.5, "tip", true, 1714557600000, 0.5], 1);
    row(b, [5n, 12, false, new Date(1000), "0.25"], 2);
    row(b, [-999, null, 1, "2000", 1], 3); // -999 is a declared missing marker, as text or number
    row(b, [1, "a", 1, 5, 1.01], 4);
    row(b, [1, "a", 1, true, 0.5], 5);
    row(b, [Number.NaN, "a", 1, 5, 0.5], 6);
    row(b, [1, { a: 1 }, 1, 5, 0.5], 7);
    expect(b.rowCount).toBe(3);
    const batch = b.take();
    expect(batch.rowCount).toBe(3);
    const x = batch.columns.get("x");
    const crop = batch.columns.get("crop");
    const open = batch.columns.get("open");
    const at = batch.columns.get("at");
    if (
      x?.kind !== "number" ||
      crop?.kind !== "category" ||
      open?.kind !== "label" ||
      at?.kind !== "number"
    ) {
      throw new Error("unexpected column kinds");
    }
    expect(Array.from(x.values)).toEqual([1.5, 5, Number.NaN]);
    expect(Array.from(crop.codes, (c) => (c < 0 ? null : crop.dictionary.valueOf(c)))).toEqual([
      "tip",
      "12",
      null,
    ]);
    expect(Array.from(open.values)).toEqual([1, 0, 1]);
    expect(Array.from(at.values)).toEqual([1714557600000, 1000, 2000]);
    expect(stats.rejectedByCode).toEqual({ out_of_range: 1, wrong_type: 2, not_finite: 1 });
    await sink.flush();
    expect(records.map((r) => [r.row, r.column, r.code])).toEqual([
      [4, "p", "out_of_range"],
      [5, "at", "wrong_type"],
      [6, "x", "not_finite"],
      [7, "crop", "wrong_type"],
    ]);
    expect(records[2].reason).toBe('column "x" expected a finite number, found NaN');
  });

  it("reports the first bad cell of a row in the trade's words", async () => {
    const stats: MutableReadStats = {
      file: "t",
      rowsAccepted: 0,
      rowsRejected: 0,
      rejectsPath: null,
      rejectedByCode: {},
    };
    const sink = new RejectSink("test", "plots.csv", "fail", stats, null);
    const slots = planColumns(schema, ["x", "crop", "open", "at", "p"], "test", "plots.csv");
    const b = new BatchBuilder("plots.csv", slots, 4, sink);
    b.textCell(0, "1");
    b.textCell(1, "tip");
    b.textCell(2, "1");
    b.textCell(3, "10");
    b.textCell(4, "1.5");
    b.textCell(0, "n/a"); // a second problem in the same row is not the one reported
    expect(() => b.rejectRow(17, "raw")).toThrow(
      'test: column "p" expected a probability in [0, 1], found "1.5" (plots.csv row 17)',
    );
  });
});
