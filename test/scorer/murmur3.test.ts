import { createRequire } from "node:module";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { murmur3, murmur3Parts } from "../../scorer/murmur3.js";
import { murmur3Bytes, murmur3Text } from "./murmur3-bytes.js";

/** imurmurhash (Jens Taylor's MurmurHash3 for JS) is installed as a dependency of eslint; it hashes char codes as bytes, so it takes a "binary string". */
function loadImurmurhash(): ((key: string, seed: number) => { result(): number }) | null {
  try {
    return createRequire(import.meta.url)("imurmurhash") as (
      key: string,
      seed: number,
    ) => { result(): number };
  } catch {
    return null;
  }
}

describe("murmur3", () => {
  it("matches the widely used MurmurHash3_x86_32 reference vectors", () => {
    // Vectors quoted from memory of the commonly published test table for
    // MurmurHash3_x86_32 (seeded, over the bytes of ASCII text).
    expect(murmur3("", 0)).toBe(0);
    expect(murmur3("", 1)).toBe(0x514e28b7);
    expect(murmur3("hello", 0)).toBe(0x248bfa47);
    expect(murmur3("Hello, world!", 1234)).toBe(0xfaf6cdb3);
    expect(murmur3("The quick brown fox jumps over the lazy dog", 0)).toBe(0x2e4ff723);
  });

  it("agrees with a byte-at-a-time port over UTF-8 bytes, for any text and seed", () => {
    fc.assert(
      fc.property(fc.string({ unit: "grapheme", maxLength: 40 }), fc.nat(), (text, seed) => {
        expect(murmur3(text, seed)).toBe(murmur3Text(text, seed));
      }),
      { numRuns: 500 },
    );
    // Every tail length, two- three- and four-byte characters, a lone surrogate (U+FFFD, as TextEncoder).
    for (const text of [
      "a",
      "ab",
      "abc",
      "abcd",
      "é",
      "kale=grünkohl",
      "区画",
      "🥕🥬",
      "x\ud800y",
      "\udc00",
    ]) {
      expect(murmur3(text, 7)).toBe(murmur3Text(text, 7));
    }
  });

  it("hashes pieces as their concatenation", () => {
    fc.assert(
      fc.property(
        fc.array(fc.string({ unit: "grapheme-ascii", maxLength: 9 }), { maxLength: 6 }),
        fc.nat(),
        (parts, seed) => {
          expect(murmur3Parts(parts, parts.length, seed)).toBe(murmur3(parts.join(""), seed));
        },
      ),
      { numRuns: 300 },
    );
    expect(murmur3Parts(["crop=", "kale", "&season=", "spring"], 4, 0)).toBe(
      murmur3("crop=kale&season=spring", 0),
    );
  });

  const imurmurhash = loadImurmurhash();
  it.skipIf(imurmurhash === null)(
    "agrees with imurmurhash, an independent implementation from npm",
    () => {
      const other = imurmurhash!;
      fc.assert(
        fc.property(fc.string({ unit: "grapheme", maxLength: 30 }), fc.nat(), (text, seed) => {
          const binary = String.fromCharCode(...new TextEncoder().encode(text));
          expect(murmur3(text, seed)).toBe(other(binary, seed).result());
        }),
        { numRuns: 300 },
      );
    },
  );

  it("byte port sanity: the same reference vectors", () => {
    expect(murmur3Bytes(new Uint8Array(0), 1)).toBe(0x514e28b7);
    expect(murmur3Text("hello", 0)).toBe(0x248bfa47);
  });
});
