/** Plain decimal or scientific notation, optionally padded with spaces or tabs. */
const decimal = /^[ \t]*[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?[ \t]*$/;
/** Words some tools write for non-finite values. */
const nonFiniteWord = /^[ \t]*[+-]?(?:nan|inf|infinity)[ \t]*$/i;

/**
 * Reads a cell's text as a number by the strict decimal grammar: hex, binary,
 * empty text and words are not numbers (unlike `Number()`, which would turn ""
 * into 0 and "0x10" into 16). Returns NaN when the text is not a number and
 * ±Infinity when it names or overflows to infinity ("Infinity", "1e999"), so a
 * caller can tell "not a number" from "not finite".
 *
 * @example
 * parseNumberText("2.5e3"); // 2500
 * parseNumberText("n/a"); // NaN
 * parseNumberText("1e999"); // Infinity
 */
export function parseNumberText(text: string): number {
  if (decimal.test(text)) return Number(text);
  if (nonFiniteWord.test(text)) {
    return /nan/i.test(text) ? Number.NaN : text.trimStart().startsWith("-") ? -Infinity : Infinity;
  }
  return Number.NaN;
}

/** Whether the text names a non-finite value ("NaN", "-Infinity", "inf") or overflows ("1e999"). */
export function isNonFiniteText(text: string): boolean {
  return nonFiniteWord.test(text) || (decimal.test(text) && !Number.isFinite(Number(text)));
}
