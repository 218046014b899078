import { describe, expect, it } from "vitest";
import { canonicalJson } from "../../scorer/canonical-json.js";

describe("canonicalJson", () => {
  it("sorts keys, drops whitespace and the omitted top-level key only", () => {
    const value = { b: { z: 1, a: [true, null, "x"] }, a: 2, checksum: "s", c: { checksum: 3 } };
    expect(canonicalJson(value, "checksum")).toBe(
      '{"a":2,"b":{"a":[true,null,"x"],"z":1},"c":{"checksum":3}}',
    );
  });

  it("writes numbers as the shortest text that reads back to the same double", () => {
    // ECMAScript Number::toString is the shortest round-trip form (common practice).
    const numbers = [0.1 + 0.2, 1e21, 5e-324, -1.5e-7, 123456789012345680000, 2 ** 53 + 2, -0];
    expect(canonicalJson(numbers)).toBe(
      "[0.30000000000000004,1e+21,5e-324,-1.5e-7,123456789012345680000,9007199254740994,0]",
    );
    for (const n of numbers) expect(Number(canonicalJson(n))).toBe(n === 0 ? 0 : n);
  });

  it("gives the same text whatever the key order of the input", () => {
    const a = JSON.parse('{"x":1,"y":[{"q":1,"p":2}],"__proto__":{"k":0}}') as unknown;
    const b = JSON.parse('{"__proto__":{"k":0},"y":[{"p":2,"q":1}],"x":1}') as unknown;
    expect(canonicalJson(a)).toBe(canonicalJson(b));
    expect(canonicalJson(a)).toBe('{"__proto__":{"k":0},"x":1,"y":[{"p":2,"q":1}]}');
  });

  it("refuses values JSON cannot hold", () => {
    expect(() => canonicalJson([1, NaN])).toThrow(/finite/);
    expect(() => canonicalJson({ a: Infinity })).toThrow(/finite/);
    expect(() => canonicalJson({ a: undefined })).toThrow(/JSON value/);
  });
});
