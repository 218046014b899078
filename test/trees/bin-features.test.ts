import { describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import { binFeatures } from "../../trainer/trees/bin-features.js";
import { quantileBinEdges } from "../../trainer/trees/quantile-bin-edges.js";
import { testRandom } from "./tree-test-helpers.js";

const options = { bins: 255, binSampleRows: 1000, maxCategories: 4, seed: 1 };

describe("quantileBinEdges", () => {
  it("gives each distinct value its own bin when they fit, with edges halfway between", () => {
    expect(Array.from(quantileBinEdges(Float64Array.of(1, 1, 2, 3), 255))).toEqual([
      1.5,
      2.5,
      Number.MAX_VALUE,
    ]);
    expect(Array.from(quantileBinEdges(new Float64Array(0), 255))).toEqual([Number.MAX_VALUE]);
  });

  // Quantile binning (common practice): about equal sample counts per bin; a value
  // is never split across bins, so a heavy value fills a bin of its own.
  it("closes bins near equal shares and keeps a heavy value whole", () => {
    const random = testRandom(1);
    const values = Float64Array.from({ length: 10_000 }, (_, i) =>
      i < 3000 ? 0.5 : random(),
    ).sort();
    const edges = quantileBinEdges(values, 10);
    expect(edges.length).toBeLessThanOrEqual(10);
    const counts = new Array<number>(edges.length).fill(0);
    for (const x of values) counts[edges.findIndex((e) => x <= e)]++;
    const heavy = edges.findIndex((e) => 0.5 <= e);
    expect(counts[heavy]).toBeGreaterThanOrEqual(3000);
    const others = counts.filter((_, b) => b !== heavy);
    // 7,000 other values over the remaining bins: each within 40 % of an even share.
    const share = 7000 / others.length;
    for (const c of others) expect(Math.abs(c - share)).toBeLessThan(0.4 * share);
  });
});

describe("binFeatures", () => {
  const random = testRandom(2);
  const rows = 5000;
  const x = Float64Array.from({ length: rows }, (_, r) => (r % 10 === 0 ? NaN : random() * 100));

  it("puts raw x in bin b with edges[b - 1] < x <= edges[b], NaN in the missing bin", () => {
    const binned = binFeatures(
      { rowCount: rows, numeric: [{ name: "x", values: x }], categorical: [] },
      { ...options, bins: 32 },
    );
    const edges = binned.edges[0] as Float64Array;
    expect(binned.valueBins[0]).toBe(edges.length);
    expect(edges.length).toBeLessThanOrEqual(32);
    for (let r = 0; r < rows; r++) {
      const b = binned.bins[r];
      if (Number.isNaN(x[r])) expect(b).toBe(edges.length);
      else {
        expect(x[r] <= edges[b]).toBe(true);
        if (b > 0) expect(x[r] > edges[b - 1]).toBe(true);
      }
    }
    expect(binned.bins.buffer).toBeInstanceOf(SharedArrayBuffer);
  });

  it("bins low-cardinality categories by contract code and leaves wide ones to the heads", () => {
    const narrow = Int32Array.from({ length: rows }, (_, r) =>
      r % 7 === 0 ? -1 : [3, 1, 4][r % 3],
    );
    const wide = Int32Array.from({ length: rows }, (_, r) => r % 9);
    const binned = binFeatures(
      {
        rowCount: rows,
        numeric: [{ name: "x", values: x }],
        categorical: [
          { name: "narrow", codes: narrow, dictionary: ["a", "b", "c", "d", "e"] },
          { name: "wide", codes: wide, dictionary: Array.from({ length: 9 }, (_, i) => `w${i}`) },
        ],
      },
      options,
    );
    // Present codes 1, 3, 4 (b, d, e) become contract codes 0, 1, 2; the rest is missing.
    expect(binned.contract).toEqual({
      numeric: ["x"],
      categorical: [
        { name: "narrow", values: ["b", "d", "e"] },
        { name: "wide", values: [] },
      ],
    });
    expect(binned.columnCount).toBe(2);
    expect(Array.from(binned.columnFeature)).toEqual([0, 1]);
    expect(binned.valueBins[1]).toBe(3);
    const expected: Record<number, number> = { [-1]: 3, 1: 0, 3: 1, 4: 2 };
    for (let r = 0; r < rows; r++) expect(binned.bins[2 * r + 1]).toBe(expected[narrow[r]]);
  });

  it("samples the same rows for the same seed", () => {
    const a = binFeatures(
      { rowCount: rows, numeric: [{ name: "x", values: x }], categorical: [] },
      { ...options, binSampleRows: 300 },
    );
    const b = binFeatures(
      { rowCount: rows, numeric: [{ name: "x", values: x }], categorical: [] },
      { ...options, binSampleRows: 300 },
    );
    expect(Array.from(a.edges[0] as Float64Array)).toEqual(Array.from(b.edges[0] as Float64Array));
  });

  it("refuses infinities and bad codes with coded issues", () => {
    const bad = () =>
      binFeatures(
        {
          rowCount: 3,
          numeric: [{ name: "x", values: Float64Array.of(1, Infinity, 2) }],
          categorical: [{ name: "c", codes: Int32Array.of(0, 5, 1), dictionary: ["a", "b"] }],
        },
        options,
      );
    expect(bad).toThrow(LeafcastError);
    expect(bad).toThrow(
      'trees: column "x" expected a finite number or NaN (missing), found Infinity at row 2',
    );
    try {
      bad();
    } catch (error) {
      expect((error as LeafcastError).issues.map((i) => i.code)).toEqual([
        "not_finite",
        "bad_category_code",
      ]);
    }
  });
});
