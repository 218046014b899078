/** 1 / k, so the search multiplies instead of dividing. */
const INVERSE = Float64Array.from({ length: 201 }, (_, k) => 1 / k);
const TWO_PI = 2 * Math.PI;

/**
 * A Poisson draw from two given uniforms in [0, 1): inversion by sequential
 * search on u for means below 30 (pass exp(-mean) when it is known, else
 * NaN), a rounded normal from u and v (Box-Muller) above, which is close
 * enough for a feature; v is used only then. Returns a whole number; it takes its uniforms as
 * arguments so the generator can draw them in bulk, a fixed number per row.
 *
 * @example
 * poissonDraw(3, Math.exp(-3), 0.5, 0.25); // 3
 */
export function poissonDraw(mean: number, expNegMean: number, u: number, v: number): number {
  if (mean <= 0) return 0;
  if (mean >= 30) {
    const z = Math.sqrt(-2 * Math.log(1 - u)) * Math.cos(TWO_PI * v);
    const k = Math.round(mean + Math.sqrt(mean) * z);
    return k < 0 ? 0 : k;
  }
  let p = expNegMean === expNegMean ? expNegMean : Math.exp(-mean);
  let cdf = p;
  let k = 0;
  while (u >= cdf && k < 200) {
    k++;
    p *= mean * INVERSE[k];
    cdf += p;
  }
  return k;
}
