import { EXP_NEG_POW2, EXP_NEG_STEP, LOG1P_AT, LOG1P_INVERSE } from "./logistic-tables.js";

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
 * e / (1 + e)^2, loss = max(s, 0) - y s + log1p(e), so nothing overflows and small
 * losses keep their digits. exp and log1p are computed inline from tables (see
 * logistic-tables.ts; rounding by `(x + 0.5) | 0`, since Math.round made the
 * loop twice as slow in a probe here). Returns the position after the last
 * packed pair (`position` itself when it is -1). Kernel: no checks, no allocation.
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
  const step = EXP_NEG_STEP;
  const pow2 = EXP_NEG_POW2;
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
    const a = s < 0 ? s : -s;
    let e = 0;
    if (a >= -745) {
      // m = round(-64 a / ln 2); x = a + m ln2/64 with ln 2 split as in fdlibm (hi / 64, lo / 64).
      const m = (-a * 92.33248261689366 + 0.5) | 0;
      const x = a + m * 0.01083042469326756 + m * 2.9815858269852933e-12;
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
    const w = weight === null ? 1 : weight[r];
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
