import type { HeadModel } from "../../scorer/model-types.js";
import { ftrlWeight } from "./ftrl-weight.js";
import type { HeadState } from "./head-state.js";
import { makeFtrlRule } from "./make-ftrl-rule.js";

/**
 * The servable heads of a state: per outcome the non-zero weights (ascending
 * index), the bias, and under "recalibrate" the negative keep rate the scorer maps
 * probabilities back with (1 otherwise: under "weight" the head is already
 * calibrated on unsampled data).
 *
 * @example
 * const heads = exportHeadModels(state);
 * heads[0].index.length; // non-zero weights of the first outcome
 */
export function exportHeadModels(state: HeadState): HeadModel[] {
  const { z, n, headCount: heads, info } = state;
  const rule = makeFtrlRule(info);
  const invAlpha = 1 / rule.alpha;
  const weightOf = (at: number, lambda1: number, lambda2: number): number =>
    ftrlWeight(z[at], Math.sqrt(n[at]), invAlpha, rule.beta, lambda1, lambda2);
  return info.outcomes.map((outcome, h): HeadModel => {
    let count = 0;
    for (let c = 0; c < info.indexSize; c++) {
      if (weightOf(c * heads + h, rule.lambda1, rule.lambda2) !== 0) count++;
    }
    const index = new Int32Array(count);
    const weight = new Float64Array(count);
    for (let c = 0, k = 0; c < info.indexSize; c++) {
      const w = weightOf(c * heads + h, rule.lambda1, rule.lambda2);
      if (w !== 0) {
        index[k] = c;
        weight[k++] = w;
      }
    }
    const bias = weightOf(state.biasCoordinate * heads + h, 0, 0);
    const recalibrated = info.downsampleCorrection === "recalibrate";
    return {
      outcome,
      bias: bias === 0 ? 0 : bias,
      index,
      weight,
      negativeKeepRate: recalibrated ? info.negativeKeepRate[h] : 1,
    };
  });
}
