import fc from "fast-check";

/**
 * Byte-level damage to a valid file: the kinds of corruption a log drop meets
 * (a flipped or lost byte, a cut-off end, a stray quote or NUL, line ends
 * rewritten to a lone CR, a BOM pasted mid-file, Latin-1 or broken UTF-8).
 * Positions are drawn as fractions so a mutation applies to any file length.
 */
export type Mutation =
  | { kind: "flip"; at: number; byte: number }
  | { kind: "insert"; at: number; bytes: number[] }
  | { kind: "delete"; at: number; count: number }
  | { kind: "truncate"; at: number }
  | { kind: "duplicate"; at: number; count: number }
  | { kind: "lone-cr" };

/** Byte sequences that are not UTF-8, or are odd but valid (BOM, NUL, U+FFFD itself). */
const oddBytes: number[][] = [
  [0x00],
  [0x22],
  [0x22, 0x22],
  [0x2c],
  [0x0a],
  [0x0d],
  [0xff],
  [0xfe],
  [0xe9], // Latin-1 "é"
  [0xc3], // a lead byte with no continuation
  [0x80], // a lone continuation byte
  [0xc0, 0xaf], // overlong "/"
  [0xe2, 0x82], // cut-off three-byte sequence
  [0xed, 0xa0, 0x80], // an encoded surrogate
  [0xf4, 0x90, 0x80, 0x80], // past U+10FFFF
  [0xf0, 0x9f, 0x98], // cut-off four-byte sequence
  [0xef, 0xbb, 0xbf], // BOM
  [0xef, 0xbf, 0xbd], // a real U+FFFD
  [0x7b], // {
  [0x7d], // }
  [0x5c], // backslash
];

const fraction = fc.integer({ min: 0, max: 1_000_000 }).map((n) => n / 1_000_000);

export const mutationArb: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({
    kind: fc.constant("flip" as const),
    at: fraction,
    byte: fc.integer({ min: 0, max: 255 }),
  }),
  fc.record({
    kind: fc.constant("insert" as const),
    at: fraction,
    bytes: fc.oneof(
      fc.constantFrom(...oddBytes),
      fc.array(fc.integer({ min: 0, max: 255 }), { minLength: 1, maxLength: 3 }),
    ),
  }),
  fc.record({
    kind: fc.constant("delete" as const),
    at: fraction,
    count: fc.integer({ min: 1, max: 4 }),
  }),
  fc.record({ kind: fc.constant("truncate" as const), at: fraction }),
  fc.record({
    kind: fc.constant("duplicate" as const),
    at: fraction,
    count: fc.integer({ min: 1, max: 12 }),
  }),
  fc.constant({ kind: "lone-cr" as const }),
);

/** Applies the mutations in turn to a copy of `bytes`. */
export function mutate(bytes: Uint8Array, mutations: readonly Mutation[]): Uint8Array {
  let out = Array.from(bytes);
  for (const m of mutations) {
    const at = m.kind === "lone-cr" ? 0 : Math.floor(m.at * (out.length + 1));
    switch (m.kind) {
      case "flip":
        if (at < out.length) out[at] = m.byte;
        break;
      case "insert":
        out.splice(at, 0, ...m.bytes);
        break;
      case "delete":
        out.splice(at, m.count);
        break;
      case "truncate":
        out = out.slice(0, at);
        break;
      case "duplicate":
        out.splice(at, 0, ...out.slice(at, at + m.count));
        break;
      case "lone-cr":
        out = out
          .filter((b, i) => !(b === 0x0d && out[i + 1] === 0x0a))
          .map((b) => (b === 0x0a ? 0x0d : b));
        break;
    }
  }
  return Uint8Array.from(out);
}
