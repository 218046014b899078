import { checkMetricInputs } from "./check-metric-inputs.js";
import { sortIndexByKey } from "./sort-index-by-key.js";

/**
 * Area under the ROC curve: the (weighted) share of positive-negative pairs that the
 * prediction orders correctly, a tied pair counting one half (the Mann-Whitney U
 * statistic over the product of the class weights). NaN when one class is absent.
 *
 * O(n log n): sorts a Uint32Array of row indexes by score, then walks each run of
 * equal scores once, crediting its positives with every negative below the run and
 * half of the negatives inside it.
 *
 * @example
 * rocAuc(new Float64Array([0.1, 0.4, 0.35, 0.8]), new Uint8Array([0, 0, 1, 1])); // 0.75
 */
export function rocAuc(predicted: Float64Array, label: Uint8Array, weight?: Float64Array): number {
  checkMetricInputs("rocAuc", predicted, label, weight);
  return rocAucKernel(predicted, label, weight);
}

/** Trusts its input (see checkMetricInputs); no NaN scores. */
export function rocAucKernel(
  predicted: Float64Array,
  label: Uint8Array,
  weight?: Float64Array,
): number {
  const index = new Uint32Array(predicted.length);
  for (let i = 0; i < index.length; i++) index[i] = i;
  sortIndexByKey(index, predicted);
  return sortedAuc(index, predicted, label, weight);
}

/** AUC over rows already ordered by ascending score through `index`. */
function sortedAuc(
  index: Uint32Array,
  score: Float64Array,
  label: Uint8Array,
  weight: Float64Array | undefined,
): number {
  const n = index.length;
  let negativesBelow = 0;
  let credit = 0;
  let positives = 0;
  let i = 0;
  while (i < n) {
    const s = score[index[i]];
    let runPositives = 0;
    let runNegatives = 0;
    for (; i < n && score[index[i]] === s; i++) {
      const row = index[i];
      const w = weight === undefined ? 1 : weight[row];
      if (label[row] === 1) runPositives += w;
      else runNegatives += w;
    }
    credit += runPositives * (negativesBelow + 0.5 * runNegatives);
    negativesBelow += runNegatives;
    positives += runPositives;
  }
  const pairs = positives * negativesBelow;
  return pairs > 0 ? credit / pairs : NaN;
}
