import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { writeIntegerText, writeNumberText } from "../../trainer/data/write-number-text.js";

const out = new Uint8Array(64);
const text = (value: number, decimals: number): string =>
  Buffer.from(out.subarray(0, writeNumberText(out, 0, value, decimals))).toString("latin1");

describe("writeNumberText", () => {
  it("writes grid values as fixed-point text without trailing zeros", () => {
    expect(text(0.125, 3)).toBe("0.125");
    expect(text(1.5, 3)).toBe("1.5");
    expect(text(100, 2)).toBe("100");
    expect(text(-2.05, 2)).toBe("-2.05");
    expect(text(0, 9)).toBe("0");
    expect(text(-0, 3)).toBe("0");
    expect(text(1748822400, 0)).toBe("1748822400");
    expect(text(0.000000001, 9)).toBe("0.000000001");
    expect(text(0.999999999, 9)).toBe("0.999999999");
    expect(text(123456789.5, 1)).toBe("123456789.5");
    // Beyond int32 on both sides of the point.
    expect(text(98765432109.123, 3)).toBe("98765432109.123");
    expect(text(0.123456789012345, 15)).toBe("0.123456789012345");
  });

  it("falls back to the shortest round-trip text off the grid or without decimals", () => {
    // JavaScript's Number-to-String is the shortest text that round-trips (ECMA-262 Number::toString; common practice).
    expect(text(0.1 + 0.2, 3)).toBe(String(0.1 + 0.2));
    expect(text(1e21, 0)).toBe("1e+21");
    expect(text(Math.PI, -1)).toBe(String(Math.PI));
    expect(text(-5e-324, 2)).toBe("-5e-324");
  });

  it("always parses back to the very same double (property test, fast-check)", () => {
    fc.assert(
      fc.property(
        fc.double({ noNaN: true, noDefaultInfinity: true }),
        fc.integer({ min: -1, max: 15 }),
        (v, d) => {
          const parsed = Number(text(v, d));
          // -0 is written as "0": equal as numbers, which is what readers compare.
          return parsed === v;
        },
      ),
      { numRuns: 20_000 },
    );
  });

  it("writes whole numbers up to 2^53 as String() does (fast-check)", () => {
    // Timestamps and counts beyond int32 take the split head/eight-digit path;
    // String() of a safe integer is its plain decimal digits (ECMA-262; common practice).
    fc.assert(
      fc.property(fc.maxSafeNat(), (v) => text(v, 0) === String(v) && text(-v, 2) === String(-v)),
      { numRuns: 20_000 },
    );
    for (const v of [2 ** 31, 2 ** 31 + 1, 1e8 * 21 - 1, 1e8 * 21, 1e10 - 1, 2 ** 53 - 1]) {
      expect(text(v, 0)).toBe(String(v));
    }
  });

  it("writes 32-bit integers as String() does (fast-check)", () => {
    fc.assert(
      fc.property(fc.integer({ min: -2147483648, max: 2147483647 }), (v) => {
        const end = writeIntegerText(out, 0, v);
        return Buffer.from(out.subarray(0, end)).toString("latin1") === String(v);
      }),
      { numRuns: 20_000 },
    );
    for (const v of [0, 9, 10, 99, 100, -1, 2147483647, -2147483648]) {
      expect(Buffer.from(out.subarray(0, writeIntegerText(out, 0, v))).toString("latin1")).toBe(
        String(v),
      );
    }
  });

  it("round-trips values rounded to the grid, the generator's case (fast-check)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e9, max: 1e9, noNaN: true }),
        fc.integer({ min: 0, max: 9 }),
        (x, d) => {
          const v = Math.round(x * 10 ** d) / 10 ** d + 0;
          const t = text(v, d);
          return Number(t) === v && JSON.parse(t) === v && !/e/.test(t);
        },
      ),
      { numRuns: 20_000 },
    );
  });
});
