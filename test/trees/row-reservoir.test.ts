import { describe, expect, it } from "vitest";
import type { ColumnBatch } from "../../trainer/data/column-batch.js";
import { CategoryDictionary } from "../../trainer/data/category-dictionary.js";
import { RowReservoir } from "../../trainer/trees/row-reservoir.js";

function batch(start: number, rows: number, dictionary: CategoryDictionary): ColumnBatch {
  return {
    file: "rows.csv",
    rowCount: rows,
    columns: new Map([
      ["x", { kind: "number", values: Float64Array.from({ length: rows }, (_, i) => start + i) }],
      [
        "y",
        { kind: "label", values: Uint8Array.from({ length: rows }, (_, i) => (start + i) % 2) },
      ],
      [
        "c",
        {
          kind: "category",
          codes: Int32Array.from({ length: rows }, (_, i) => (start + i) % 3),
          dictionary,
        },
      ],
    ]),
  };
}

// Reservoir sampling (Algorithm R, Vitter 1985): every row is kept with
// probability capacity / rows, whatever its position in the stream.
describe("RowReservoir", () => {
  it("keeps each row with equal probability and its columns together", () => {
    const rows = 60;
    const capacity = 12;
    const kept = new Array<number>(rows).fill(0);
    const runs = 2000;
    const dictionary = new CategoryDictionary();
    ["a", "b", "c"].forEach((v) => dictionary.codeOf(v));
    let torn = 0;
    for (let seed = 0; seed < runs; seed++) {
      const reservoir = new RowReservoir(
        { numbers: ["x"], categories: ["c"], labels: ["y"] },
        capacity,
        seed,
      );
      for (let start = 0; start < rows; start += 7)
        reservoir.add(batch(start, Math.min(7, rows - start), dictionary));
      expect(reservoir.size).toBe(capacity);
      expect(reservoir.seen).toBe(rows);
      const x = reservoir.numbers("x");
      const y = reservoir.labels("y");
      const c = reservoir.codes("c");
      for (let i = 0; i < capacity; i++) {
        kept[x[i]]++;
        if (y[i] !== x[i] % 2 || c[i] !== x[i] % 3) torn++;
      }
    }
    expect(torn).toBe(0);
    // Expected 400 per row (2000 * 12 / 60), binomial sd about 18: allow 5 sd.
    for (const count of kept) expect(Math.abs(count - (runs * capacity) / rows)).toBeLessThan(90);
  });

  it("keeps every row when they fit", () => {
    const reservoir = new RowReservoir({ numbers: ["x"], categories: [], labels: [] }, 5000, 1);
    const dictionary = new CategoryDictionary();
    reservoir.add(batch(0, 3000, dictionary));
    expect(Array.from(reservoir.numbers("x"))).toEqual(Array.from({ length: 3000 }, (_, i) => i));
  });
});
