/**
 * Lookup tables for the exp and log1p that the gradient kernel computes inline.
 * Math.exp and Math.log1p cost about 14 ns each here (calls out of optimized
 * code); a table step plus a short polynomial costs a few ns at a relative error
 * below 5e-16 (checked against Math.exp and Math.log1p in the tests). The
 * arithmetic is plain JavaScript, so every thread gets the same bits.
 *
 * exp(x), x <= 0: m = round(-64 x / ln 2), r = x + m ln2 / 64 (|r| <= ln2 / 128),
 *   exp(x) = 2^-(m >> 6) * 2^-((m & 63) / 64) * exp(r), exp(r) by degree-5 Taylor.
 * log1p(e), 0 <= e <= 1: j = round(64 e), c = 1 + j / 64, t = (e - j / 64) / c,
 *   log1p(e) = log(c) + log1p(t), |t| <= 1/128, log1p(t) by degree-7 Taylor.
 *
 * @example
 * EXP_NEG_STEP[1]; // 2^(-1/64)
 */

/** 64 / ln 2: m = round(-a * EXP_NEG_ROUND_SCALE) for exp(a), a <= 0. */
export const EXP_NEG_ROUND_SCALE = 92.33248261689366;
/** ln 2 / 64 split as in fdlibm (ln2_hi / 64, ln2_lo / 64), so r = a + m ln2/64 keeps its digits. */
export const LN2_OVER_64_HI = 0.01083042469326756;
export const LN2_OVER_64_LO = 2.9815858269852933e-12;
/** Below this a, exp(a) is 0 in doubles (exp(-745) is the last subnormal). */
export const EXP_NEG_MIN_ARG = -745;

/** 2^(-j/64), j = 0..63. */
export const EXP_NEG_STEP: Float64Array = Float64Array.from({ length: 64 }, (_, j) =>
  Math.pow(2, -j / 64),
);

/** 2^(-k), k = 0..1099 (exp(x) for x >= -745 needs k <= 1075). */
export const EXP_NEG_POW2: Float64Array = Float64Array.from({ length: 1100 }, (_, k) =>
  Math.pow(2, -k),
);

/** log1p(j/64), j = 0..64. */
export const LOG1P_AT: Float64Array = Float64Array.from({ length: 65 }, (_, j) =>
  Math.log1p(j / 64),
);

/** 1 / (1 + j/64), j = 0..64. */
export const LOG1P_INVERSE: Float64Array = Float64Array.from(
  { length: 65 },
  (_, j) => 64 / (64 + j),
);
