import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { sortIndexByKey } from "../../trainer/metrics/sort-index-by-key.js";

function identity(n: number): Uint32Array {
  return Uint32Array.from({ length: n }, (_, i) => i);
}

/** Sorted by key and a permutation of 0..n-1; checked against the built-in sort's key order. */
function isSortedPermutation(index: Uint32Array, key: Float64Array): boolean {
  const seen = new Uint8Array(key.length);
  for (let i = 0; i < index.length; i++) {
    if (seen[index[i]]) return false;
    seen[index[i]] = 1;
    if (i > 0 && key[index[i - 1]] > key[index[i]]) return false;
  }
  const reference = Float64Array.from(key).sort();
  return index.every((row, i) => key[row] === reference[i]);
}

describe("sortIndexByKey", () => {
  it("orders indexes by key on random data with ties, in both the quicksort and heap-sort paths", () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(fc.integer({ min: -5, max: 5 }), fc.double({ noNaN: true })), {
          maxLength: 300,
        }),
        fc.constantFrom(0, 1, 3, undefined),
        (values, depthLimit) => {
          const key = Float64Array.from(values);
          const index = identity(key.length);
          sortIndexByKey(index, key, depthLimit);
          return isSortedPermutation(index, key);
        },
      ),
      { numRuns: 400 },
    );
  });

  it("handles patterns that defeat naive pivots", () => {
    const n = 20_000;
    const patterns: Record<string, (i: number) => number> = {
      ascending: (i) => i,
      descending: (i) => n - i,
      constant: () => 1,
      organPipe: (i) => Math.min(i, n - i),
      sawtooth: (i) => i % 17,
      twoValues: (i) => (i * 7919) % 2,
    };
    for (const [name, f] of Object.entries(patterns)) {
      const key = Float64Array.from({ length: n }, (_, i) => f(i));
      const index = identity(n);
      sortIndexByKey(index, key);
      expect(isSortedPermutation(index, key), name).toBe(true);
    }
  });
});
