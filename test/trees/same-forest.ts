/** Bit-for-bit comparisons of fitted forests, shared by the tree tests that need them. */
import { expect } from "vitest";
import type { ForestModel } from "../../scorer/model-types.js";

/** Expects two forests to be the same to the bit: structure, thresholds, categories, leaf values. */
export function expectSameForest(a: ForestModel, b: ForestModel): void {
  expect(b.depth).toBe(a.depth);
  expect(Object.is(b.baseLogit, a.baseLogit)).toBe(true);
  expect(b.trees.length).toBe(a.trees.length);
  a.trees.forEach((tree, t) => {
    const other = b.trees[t];
    expect(Array.from(other.feature)).toEqual(Array.from(tree.feature));
    expect(bits(other.threshold)).toEqual(bits(tree.threshold));
    expect(Array.from(other.missingRight)).toEqual(Array.from(tree.missingRight));
    expect(other.rightCategories.map((c) => (c === null ? null : Array.from(c)))).toEqual(
      tree.rightCategories.map((c) => (c === null ? null : Array.from(c))),
    );
    expect(bits(other.leafValue)).toEqual(bits(tree.leafValue));
  });
}

/** The exact bit patterns of a Float64Array, so that equality means bitwise equality. */
export function bits(values: Float64Array): bigint[] {
  return Array.from(new BigInt64Array(values.buffer, values.byteOffset, values.length));
}
