import {
  EXP_NEG_MIN_ARG,
  EXP_NEG_POW2,
  EXP_NEG_ROUND_SCALE,
  EXP_NEG_STEP,
  LN2_OVER_64_HI,
  LN2_OVER_64_LO,
  LOG1P_AT,
  LOG1P_INVERSE,
} from "./logistic-tables.js";

/**
 * Newton-boosting statistics of binary log loss for rows start .. end - 1:
 * p = sigmoid(score), gradient w (p - y) and hessian w p (1 - p), written as pairs.
 * With `position` -1 row r's pair goes to (out[2r], out[2r + 1]) and validation
 * rows get zeros; with position >= 0 the training rows' pairs are packed from
 * out[2 position] on, in row order, and validation rows are skipped (this writes
 * the "ordered" gradients of a tree that uses every training row directly).
 * Also adds each row's weighted loss w (log(1 + e^s) - y s) and weight to `sums`
 * ([trainLoss, trainWeight, validLoss, validWeight] at sumsBase): rows flagged in
 * `validation` count as validation rows.
 * With e = exp(-|s|) in (0, 1]: p = 1 / (1 + e) or e / (1 + e), p (1 - p) =
 * e / (1 + e)^2, loss = max(s, 0) - y s + log1p(e), so nothing overflows. exp
 * is computed inline from tables (see logistic-tables.ts; rounding by
 * `(x + 0.5) | 0`, since Math.round made the loop twice as slow in a probe
 * here). Without weights the log1p(e) terms of a call are summed as one
 * logarithm, -log of the product of the 1 / (1 + e) already computed for p
 * (kept in range by exact powers of two): one multiplication per row instead
 * of an inline log1p, which took the kernel from about 25 to 15 ns per row in a
 * probe here. Each factor carries a rounding of 1 + e, so a row's term is exact
 * to about 1e-16 absolute rather than relative; rows with e < 2^-26 add
 * e - e^2 / 2 instead, so losses near zero keep their digits. With weights
 * every row adds w log1p(e), log1p also inline from tables. Returns the
 * position after the last packed pair (`position` itself when it is -1).
 * Kernel: no checks, no allocation.
 *
 * @example
 * const out = new Float64Array(2), sums = new Float64Array(4);
 * logLossGradients(Float64Array.of(0), Uint8Array.of(1), null, null, out, -1, 0, 1, sums, 0);
 * // out = [-0.5, 0.25], sums = [0.6931.., 1, 0, 0]
 */
export function logLossGradients(
  score: Float64Array,
  label: Uint8Array,
  weight: Float64Array | null,
  validation: Uint8Array | null,
  out: Float64Array,
  position: number,
  start: number,
  end: number,
  sums: Float64Array,
  sumsBase: number,
): number {
  if (weight !== null) {
    return weightedLogLossGradients(
      score,
      label,
      weight,
      validation,
      out,
      position,
      start,
      end,
      sums,
      sumsBase,
    );
  }
  const step = EXP_NEG_STEP;
  const pow2 = EXP_NEG_POW2;
  // Imported bindings read in the loop cost 3x here; locals are constants to the JIT.
  const minArg = EXP_NEG_MIN_ARG;
  const roundScale = EXP_NEG_ROUND_SCALE;
  const ln2Hi = LN2_OVER_64_HI;
  const ln2Lo = LN2_OVER_64_LO;
  // Per side (train, validation): the sum of max(s, 0) - y s and of small log1p
  // terms, and the product of 1 / (1 + e) with the powers of 2^-512 taken out of it.
  let trainLinear = 0;
  let trainProduct = 1;
  let trainScaled = 0;
  let validLinear = 0;
  let validProduct = 1;
  let validScaled = 0;
  let validCount = 0;
  let packed = position;
  for (let r = start; r < end; r++) {
    const s = score[r];
    const y = label[r];
    const a = -Math.abs(s);
    let e = 0;
    if (a >= minArg) {
      // m = round(-64 a / ln 2); x = a + m ln2/64. Inline: as a function reading
      // the imported tables it made the weighted loop 1.6x slower in a probe here.
      const m = (-a * roundScale + 0.5) | 0;
      const x = a + m * ln2Hi + m * ln2Lo;
      e =
        (1 + x * (1 + x * (0.5 + x * (1 / 6 + x * (1 / 24 + x / 120))))) *
        step[m & 63] *
        pow2[m >> 6];
    }
    const inverse = 1 / (1 + e);
    const p = s >= 0 ? inverse : e * inverse;
    let linear = (s > 0 ? s : 0) - y * s;
    let factor = inverse;
    if (e < SMALL_E) {
      linear += e - 0.5 * e * e;
      factor = 1;
    }
    if (validation !== null && validation[r] === 1) {
      validLinear += linear;
      validProduct *= factor;
      if (validProduct < RESCALE_BELOW) {
        validProduct *= RESCALE;
        validScaled++;
      }
      validCount++;
      if (position < 0) {
        out[2 * r] = 0;
        out[2 * r + 1] = 0;
      }
    } else {
      trainLinear += linear;
      trainProduct *= factor;
      if (trainProduct < RESCALE_BELOW) {
        trainProduct *= RESCALE;
        trainScaled++;
      }
      const k = position < 0 ? 2 * r : 2 * packed++;
      out[k] = p - y;
      out[k + 1] = e * inverse * inverse;
    }
  }
  sums[sumsBase] += trainLinear + (trainScaled * 512 * Math.LN2 - Math.log(trainProduct));
  sums[sumsBase + 1] += end - start - validCount;
  sums[sumsBase + 2] += validLinear + (validScaled * 512 * Math.LN2 - Math.log(validProduct));
  sums[sumsBase + 3] += validCount;
  return packed;
}

/** Below this e, log1p(e) = e - e^2 / 2 to double precision (the next term is e^3 / 3). */
const SMALL_E = 2 ** -26;
/** Products of factors in [1/2, 1] are multiplied by RESCALE = 2^512 (exactly) when they fall below 2^-512. */
const RESCALE_BELOW = 2 ** -512;
const RESCALE = 2 ** 512;

/** logLossGradients with row weights: every row adds w log1p(e), log1p inline from tables. */
function weightedLogLossGradients(
  score: Float64Array,
  label: Uint8Array,
  weight: Float64Array,
  validation: Uint8Array | null,
  out: Float64Array,
  position: number,
  start: number,
  end: number,
  sums: Float64Array,
  sumsBase: number,
): number {
  const step = EXP_NEG_STEP;
  const pow2 = EXP_NEG_POW2;
  // Imported bindings read in the loop cost 3x here; locals are constants to the JIT.
  const minArg = EXP_NEG_MIN_ARG;
  const roundScale = EXP_NEG_ROUND_SCALE;
  const ln2Hi = LN2_OVER_64_HI;
  const ln2Lo = LN2_OVER_64_LO;
  const logAt = LOG1P_AT;
  const inverseAt = LOG1P_INVERSE;
  let trainLoss = 0;
  let trainWeight = 0;
  let validLoss = 0;
  let validWeight = 0;
  let packed = position;
  for (let r = start; r < end; r++) {
    const s = score[r];
    const y = label[r];
    const a = -Math.abs(s);
    let e = 0;
    if (a >= minArg) {
      const m = (-a * roundScale + 0.5) | 0;
      const x = a + m * ln2Hi + m * ln2Lo;
      e =
        (1 + x * (1 + x * (0.5 + x * (1 / 6 + x * (1 / 24 + x / 120))))) *
        step[m & 63] *
        pow2[m >> 6];
    }
    const j = (e * 64 + 0.5) | 0;
    const t = (e - j * 0.015625) * inverseAt[j];
    const log1pE =
      logAt[j] + t * (1 - t * (0.5 - t * (1 / 3 - t * (0.25 - t * (0.2 - t * (1 / 6 - t / 7))))));
    const inverse = 1 / (1 + e);
    const p = s >= 0 ? inverse : e * inverse;
    const loss = (s > 0 ? s : 0) - y * s + log1pE;
    const w = weight[r];
    if (validation !== null && validation[r] === 1) {
      validLoss += w * loss;
      validWeight += w;
      if (position < 0) {
        out[2 * r] = 0;
        out[2 * r + 1] = 0;
      }
    } else {
      trainLoss += w * loss;
      trainWeight += w;
      const k = position < 0 ? 2 * r : 2 * packed++;
      out[k] = w * (p - y);
      out[k + 1] = w * e * inverse * inverse;
    }
  }
  sums[sumsBase] += trainLoss;
  sums[sumsBase + 1] += trainWeight;
  sums[sumsBase + 2] += validLoss;
  sums[sumsBase + 3] += validWeight;
  return packed;
}
