import { describe, expect, it } from "vitest";
import { CategoryByteCache } from "../../trainer/data/category-byte-cache.js";

const bytes = (text: string): Uint8Array => new TextEncoder().encode(text);

describe("CategoryByteCache", () => {
  it("finds codes by bytes and tells equal hashes apart by the bytes", () => {
    const cache = new CategoryByteCache(8);
    const kale = bytes("xxkalexx");
    const leek = bytes("leek");
    cache.add(kale, 2, 6, CategoryByteCache.hash(kale, 2, 6), 7);
    // Same hash on purpose: the bytes decide.
    cache.add(leek, 0, 4, CategoryByteCache.hash(kale, 2, 6), 9);
    const probe = bytes("kale");
    expect(cache.find(probe, 0, 4, CategoryByteCache.hash(probe, 0, 4))).toBe(7);
    expect(cache.find(leek, 0, 4, CategoryByteCache.hash(kale, 2, 6))).toBe(9);
    expect(cache.find(leek, 0, 4, CategoryByteCache.hash(leek, 0, 4))).toBe(-1);
    expect(cache.find(probe, 0, 3, CategoryByteCache.hash(probe, 0, 3))).toBe(-1);
  });

  it("stops adding when full and keeps what it has", () => {
    const cache = new CategoryByteCache(3);
    const values = ["a", "bb", "ccc", "dddd"].map(bytes);
    values.forEach((v, i) => cache.add(v, 0, v.length, CategoryByteCache.hash(v, 0, v.length), i));
    const found = values.map((v) =>
      cache.find(v, 0, v.length, CategoryByteCache.hash(v, 0, v.length)),
    );
    expect(found).toEqual([0, 1, 2, -1]);
  });

  it("grows its byte pool and entry arrays past their first sizes", () => {
    const cache = new CategoryByteCache(1000);
    const values = Array.from({ length: 1000 }, (_, i) => bytes(`value-${i}-${"x".repeat(i % 7)}`));
    values.forEach((v, i) => cache.add(v, 0, v.length, CategoryByteCache.hash(v, 0, v.length), i));
    values.forEach((v, i) =>
      expect(cache.find(v, 0, v.length, CategoryByteCache.hash(v, 0, v.length))).toBe(i),
    );
  });
});
