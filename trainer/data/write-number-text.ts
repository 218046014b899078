/** 10 ** d for d = 0..15, exact in a double. */
const POW10 = Float64Array.from({ length: 16 }, (_, d) => 10 ** d);
const TWO_POW_53 = 2 ** 53;
const INT_LIMIT = 2 ** 31;
/** "00" ... "99" as ASCII pairs. */
const PAIRS = Uint8Array.from({ length: 200 }, (_, i) =>
  i % 2 === 0 ? 48 + Math.floor(i / 20) : 48 + ((i >> 1) % 10),
);
/**
 * "0000" ... "9999" as ASCII quads (40 KB, stays in cache): nine-decimal
 * probabilities take two table copies and a digit instead of five steps.
 */
const QUADS = Uint8Array.from(
  { length: 40_000 },
  (_, i) => 48 + (Math.floor((i >> 2) / 10 ** (3 - (i & 3))) % 10),
);

/**
 * Writes a finite number as ASCII into `out` at `pos` and returns the position
 * after it; the text always parses back (Number(), JSON.parse) to the very same
 * double. With `decimals` >= 0 and a value on that grid (it equals
 * `Math.round(v * 10 ** decimals) / 10 ** decimals`), it writes fixed-point
 * digits without trailing zeros, several times faster than `String(v)`;
 * otherwise, or with `decimals` < 0, it writes `String(v)`, the shortest
 * round-trip text. `out` must have room for 25 bytes. -0 is written as "0".
 *
 * Why the fast path is exact: v = k / 10^d is the double nearest to the
 * decimal k / 10^d (IEEE division rounds correctly and k, 10^d are exact), and
 * a correct parser maps the decimal text of k / 10^d to that same nearest double.
 *
 * @example
 * const out = new Uint8Array(32);
 * const end = writeNumberText(out, 0, 0.125, 3); // out[0..end) is "0.125"
 */
export function writeNumberText(
  out: Uint8Array,
  pos: number,
  value: number,
  decimals: number,
): number {
  if (decimals >= 0) {
    const scale = POW10[decimals];
    const a = value < 0 ? -value : value;
    const k = Math.round(a * scale);
    if (k < TWO_POW_53 && k / scale === a) {
      if (value < 0 && k !== 0) out[pos++] = 45; // "-"
      if (k < INT_LIMIT) {
        // Int32 arithmetic (and scale < 2^31 here, as k >= scale unless whole is 0).
        const ki = k | 0;
        if (ki < scale) {
          out[pos++] = 48; // "0"
          if (ki === 0) return pos;
          out[pos++] = 46; // "."
          return writeFracInt(out, pos, ki, decimals);
        }
        const si = scale | 0;
        const fi = ki % si;
        pos = writeInt(out, pos, ((ki - fi) / si) | 0);
        if (fi === 0) return pos;
        out[pos++] = 46;
        return writeFracInt(out, pos, fi, decimals);
      }
      // Whole and fraction without a double `%` (a slow library call): the
      // quotient may round up by one, and whole * scale <= k < 2^53 is exact.
      let whole = Math.floor(k / scale);
      let frac = k - whole * scale;
      if (frac < 0) {
        whole -= 1;
        frac += scale;
      }
      pos = whole < INT_LIMIT ? writeInt(out, pos, whole | 0) : writeBig(out, pos, whole);
      if (frac !== 0) {
        out[pos++] = 46; // "."
        pos =
          frac < INT_LIMIT
            ? writeFracInt(out, pos, frac | 0, decimals)
            : writeFracBig(out, pos, frac, decimals);
      }
      return pos;
    }
  }
  const text = value === 0 ? "0" : String(value);
  for (let i = 0; i < text.length; i++) out[pos++] = text.charCodeAt(i);
  return pos;
}

/**
 * Writes a 32-bit integer as ASCII and returns the position after it: the
 * text writers' path for counts and codes, skipping the checks of decimals.
 *
 * @example
 * writeIntegerText(out, 0, -42); // "-42"
 */
export function writeIntegerText(out: Uint8Array, pos: number, value: number): number {
  if (value >= 0) return writeInt(out, pos, value);
  if (value === -2147483648) return writeNumberText(out, pos, value, 0);
  out[pos] = 45;
  return writeInt(out, pos + 1, -value);
}

/** Writes a whole number 0 <= w < 2^31, two digits per division. */
function writeInt(out: Uint8Array, pos: number, w: number): number {
  const end = pos + digitCount(w);
  let i = end;
  while (w >= 100) {
    const q = (w / 100) | 0;
    const r = (w - q * 100) << 1;
    out[--i] = PAIRS[r + 1];
    out[--i] = PAIRS[r];
    w = q;
  }
  if (w >= 10) {
    out[--i] = PAIRS[(w << 1) + 1];
    out[--i] = PAIRS[w << 1];
  } else {
    out[--i] = 48 + w;
  }
  return end;
}

/** Writes the d fraction digits of 0 < f < 2^31 (zero-padded on the left), trailing zeros dropped. */
function writeFracInt(out: Uint8Array, pos: number, f: number, d: number): number {
  while (f % 10 === 0) {
    f = (f / 10) | 0;
    d--;
  }
  const end = pos + d;
  let i = end;
  while (i - pos >= 4) {
    const q = (f / 10_000) | 0;
    const r = (f - q * 10_000) << 2;
    out[--i] = QUADS[r + 3];
    out[--i] = QUADS[r + 2];
    out[--i] = QUADS[r + 1];
    out[--i] = QUADS[r];
    f = q;
  }
  if (i - pos >= 2) {
    const q = (f / 100) | 0;
    const r = (f - q * 100) << 1;
    out[--i] = PAIRS[r + 1];
    out[--i] = PAIRS[r];
    f = q;
  }
  if (i > pos) out[--i] = 48 + f;
  return end;
}

function digitCount(w: number): number {
  if (w < 100_000) return w < 10 ? 1 : w < 100 ? 2 : w < 1000 ? 3 : w < 10_000 ? 4 : 5;
  return w < 1_000_000 ? 6 : w < 10_000_000 ? 7 : w < 100_000_000 ? 8 : w < 1_000_000_000 ? 9 : 10;
}

/**
 * Whole numbers from 2^31 to 2^53 (Unix-second timestamps are here): split
 * exactly into a head below 2^31 and eight tail digits, so the hot case costs
 * two table copies instead of ten double divisions.
 */
function writeBig(out: Uint8Array, pos: number, whole: number): number {
  let high = Math.floor(whole / 1e8);
  // The quotient may round up to the next whole: high * 1e8 is exact, so correct it.
  let low = whole - high * 1e8;
  if (low < 0) {
    high -= 1;
    low += 1e8;
  }
  pos = writeInt(out, pos, high);
  let lowInt = low | 0;
  const q = (lowInt / 10_000) | 0;
  let r = (lowInt - q * 10_000) << 2;
  out[pos + 7] = QUADS[r + 3];
  out[pos + 6] = QUADS[r + 2];
  out[pos + 5] = QUADS[r + 1];
  out[pos + 4] = QUADS[r];
  lowInt = q;
  r = lowInt << 2;
  out[pos + 3] = QUADS[r + 3];
  out[pos + 2] = QUADS[r + 2];
  out[pos + 1] = QUADS[r + 1];
  out[pos] = QUADS[r];
  return pos + 8;
}

/** Fractions of 2^31 and more (only with many decimals), in double arithmetic. */
function writeFracBig(out: Uint8Array, pos: number, frac: number, d: number): number {
  while (frac % 10 === 0) {
    frac /= 10;
    d--;
  }
  for (let i = pos + d - 1; i >= pos; i--) {
    const q = Math.floor(frac / 10);
    out[i] = 48 + (frac - q * 10);
    frac = q;
  }
  return pos + d;
}
