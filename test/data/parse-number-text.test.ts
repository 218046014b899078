import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { isNonFiniteText, parseNumberText } from "../../trainer/data/parse-number-text.js";

describe("parseNumberText", () => {
  it("reads decimal and scientific notation as Number() does", () => {
    // Oracle: the built-in Number() on texts that the strict grammar accepts.
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (v) => {
        for (const text of [String(v), v.toExponential(), v.toPrecision(17)]) {
          expect(parseNumberText(text)).toBe(Number(text));
        }
      }),
    );
    expect(parseNumberText(" 2.5e3\t")).toBe(2500);
    expect(parseNumberText(".5")).toBe(0.5);
    expect(parseNumberText("5.")).toBe(5);
    expect(parseNumberText("+7")).toBe(7);
  });

  it("refuses what Number() would coerce", () => {
    for (const text of ["", " ", "0x10", "0b1", "1_000", "1,5", "n/a", "1e", "--1", "."]) {
      expect(parseNumberText(text), text).toBeNaN();
    }
  });

  it("tells non-finite text from text that is not a number", () => {
    for (const text of ["NaN", "nan", "Infinity", "-Infinity", "inf", "-INF", "1e999", "-1e400"]) {
      expect(isNonFiniteText(text), text).toBe(true);
      expect(Number.isFinite(parseNumberText(text)), text).toBe(false);
    }
    expect(parseNumberText("1e999")).toBe(Infinity);
    expect(parseNumberText("-inf")).toBe(-Infinity);
    for (const text of ["n/a", "", "1e308", "infinite"])
      expect(isNonFiniteText(text), text).toBe(false);
  });
});
