import type { HeadModel } from "../../scorer/model-types.js";
import type { HeadState } from "./head-state.js";
import { exportedWeightOf } from "./weight-average.js";

/**
 * The servable heads of a state: per outcome the non-zero weights (ascending
 * index), the bias, and under "recalibrate" the negative keep rate the scorer maps
 * probabilities back with (1 otherwise: under "weight" the head is already
 * calibrated on unsampled data). The weights are the latest ones, or under
 * info.averaging their moving average (see weight-average.ts).
 *
 * @example
 * const heads = exportHeadModels(state);
 * heads[0].index.length; // non-zero weights of the first outcome
 */
export function exportHeadModels(state: HeadState): HeadModel[] {
  const { info } = state;
  const weightOf = exportedWeightOf(state);
  return info.outcomes.map((outcome, h): HeadModel => {
    // One pass: every weight is computed once (with averaging, that is an average and a latest weight).
    const indexes: number[] = [];
    const weights: number[] = [];
    for (let c = 0; c < info.indexSize; c++) {
      const w = weightOf(c, h);
      if (w !== 0) {
        indexes.push(c);
        weights.push(w);
      }
    }
    const index = Int32Array.from(indexes);
    const weight = Float64Array.from(weights);
    const bias = weightOf(state.biasCoordinate, h);
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
