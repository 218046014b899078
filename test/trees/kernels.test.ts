import { describe, expect, it } from "vitest";
import { binNumericColumn, padEdges } from "../../trainer/trees/bin-kernels.js";
import { chooseValidationRows } from "../../trainer/trees/choose-validation-rows.js";
import { accumulateHistogram } from "../../trainer/trees/histogram-kernel.js";
import { partitionRows } from "../../trainer/trees/partition-rows.js";
import { testRandom } from "./tree-test-helpers.js";

// Small hand-checked cases of the kernels; expected values are worked out by hand
// in the comments.
describe("tree kernels", () => {
  it("partitionRows is a stable partition that carries gradient pairs and bins along", () => {
    // Bins [3, 0, 7, 1] in one column at positions 1 .. 4 (stride 4: one word per row);
    // bins above 2 go right, so by hand: left rows 1, 3 (bins 0, 1), right rows 0, 2 (bins 3, 7).
    const table = new Uint8Array(512).fill(1, 256 + 3, 512);
    const ordered = Float64Array.of(-1, -1, 0, 0.5, 1, 1.5, 2, 2.5, 3, 3.5);
    const words = Uint32Array.of(99, 3, 0, 7, 1);
    const placed = new Uint8Array(words.buffer);
    const left = partitionRows(
      placed,
      words,
      4,
      ordered,
      1,
      5,
      0,
      table,
      256,
      new Float64Array(8),
      new Uint32Array(4),
    );
    expect(left).toBe(2);
    // Position 0 is outside the segment; row k's pair is (k, k + 0.5).
    expect(Array.from(ordered)).toEqual([-1, -1, 1, 1.5, 3, 3.5, 0, 0.5, 2, 2.5]);
    expect(Array.from(words)).toEqual([99, 0, 1, 3, 7]);
  });

  // 3 columns use the general loop (stride 4), 8 columns the two-word loop (stride 8),
  // which reads the split column's bin out of the first word (columns 0 .. 3) or the second.
  for (const [columns, column] of [
    [3, 2],
    [8, 1],
    [8, 7],
  ]) {
    it(`partitionRows keeps every row once, with its own bins, on random data (${columns} columns, split on ${column})`, () => {
      const random = testRandom(columns);
      const n = 5000;
      const stride = 4 * Math.ceil(columns / 4);
      const bins = Uint8Array.from({ length: columns * n }, () => Math.floor(random() * 256));
      const words = new Uint32Array((n * stride) / 4);
      const placed = new Uint8Array(words.buffer);
      for (let r = 0; r < n; r++)
        placed.set(bins.subarray(r * columns, (r + 1) * columns), r * stride);
      const table = Uint8Array.from({ length: 256 }, (_, b) => (b % 3 === 0 ? 1 : 0));
      // Each position's pair names its row: (r, r).
      const ordered = Float64Array.from({ length: 2 * n }, (_, k) => Math.floor(k / 2));
      const left = partitionRows(
        placed,
        words,
        stride,
        ordered,
        0,
        n,
        column,
        table,
        0,
        new Float64Array(2 * n),
        new Uint32Array((n * stride) / 4),
      );
      const goesRight = (r: number): boolean => table[bins[columns * r + column]] === 1;
      const expected = [
        ...Array.from({ length: n }, (_, r) => r).filter((r) => !goesRight(r)),
        ...Array.from({ length: n }, (_, r) => r).filter(goesRight),
      ];
      expect(left).toBe(expected.findIndex(goesRight));
      const rows = Array.from({ length: n }, (_, i) => ordered[2 * i]);
      expect(rows).toEqual(expected);
      for (let i = 0; i < n; i++) {
        expect(ordered[2 * i + 1]).toBe(rows[i]);
        for (let c = 0; c < columns; c++)
          expect(placed[i * stride + c]).toBe(bins[rows[i] * columns + c]);
      }
    });
  }

  it("accumulateHistogram sums gradient and hessian per bin by position", () => {
    const hist = new Float64Array(2 * 256 * 2);
    // Two columns at stride 4: position 0 has bins (1, 0), position 1 has bins (1, 5).
    accumulateHistogram(
      Uint8Array.of(1, 0, 0, 0, 1, 5, 0, 0),
      4,
      2,
      0,
      2,
      Float64Array.of(0.5, 0.25, -2, 1),
      hist,
    );
    expect(Array.from(hist.subarray(2, 4))).toEqual([-1.5, 1.25]); // column 0, bin 1: both rows
    expect(Array.from(hist.subarray(512, 514))).toEqual([0.5, 0.25]); // column 1, bin 0: row 0
    expect(Array.from(hist.subarray(512 + 10, 512 + 12))).toEqual([-2, 1]); // column 1, bin 5: row 1
    expect(hist.reduce((sum, x) => sum + Math.abs(x), 0)).toBe(1.5 + 1.25 + 0.75 + 3); // nothing else
  });

  it("binNumericColumn finds the first edge at or above each value", () => {
    const edges = Float64Array.of(-1, 0, 2.5, Number.MAX_VALUE);
    const values = Float64Array.of(-5, -1, -0.5, 0, 1, 2.5, 2.6, 1e300, NaN);
    const out = new Uint8Array(values.length);
    binNumericColumn(values, padEdges(edges), out, 1, 0, 4);
    expect(Array.from(out)).toEqual([0, 0, 1, 1, 2, 2, 3, 3, 4]);
  });

  it("chooseValidationRows holds out the latest rows, ties by file order", () => {
    const mask = chooseValidationRows(10, 0.3, Float64Array.of(5, 1, 9, 9, 3, 4, 6, 7, 8, NaN), 1);
    expect(Array.from(mask ?? [])).toEqual([0, 0, 1, 1, 0, 0, 0, 0, 1, 0]);
    const drawn = chooseValidationRows(1000, 0.25, null, 7);
    expect(drawn?.reduce((a, b) => a + b, 0)).toBe(250);
    expect(chooseValidationRows(1000, 0.25, null, 7)).toEqual(drawn); // seeded
    expect(chooseValidationRows(10, 0, null, 7)).toBeNull();
  });
});
