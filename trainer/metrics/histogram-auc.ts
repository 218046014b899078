/** AUC from a score histogram, with the largest error the binning can cause. */
export interface HistogramAuc {
  readonly auc: number;
  /** |auc - exact AUC| is at most this. */
  readonly errorBound: number;
}

/**
 * ROC AUC from a histogram of scores: `histogram` holds, for bins in ascending score
 * order starting at `offset`, the pair (negative weight, positive weight). Rows in the
 * same bin are treated as tied and credited one half per pair. A pair in different bins
 * is ordered exactly as by the scores (bins are monotone in the score), so only pairs
 * sharing a bin can be wrong, each by at most one half of a pair:
 * |AUC_hist - AUC_exact| <= (1/2) * sum_b P_b N_b / (P N),
 * computed from the histogram itself and returned as errorBound. It is 0 when no bin
 * holds both classes, and pairs that are truly tied cost nothing beyond the bound.
 *
 * @example
 * // bins: [2 negatives], [1 negative, 1 positive], [2 positives]
 * histogramAuc(Float64Array.of(2, 0, 1, 1, 0, 2), 0, 3);
 * // auc = (1 * (2 + 0.5) + 2 * 3) / (3 * 3) = 0.9444..., errorBound = 0.5 * 1 / 9
 */
export function histogramAuc(
  histogram: Float64Array,
  offset: number,
  binCount: number,
): HistogramAuc {
  let negativesBelow = 0;
  let positives = 0;
  let credit = 0;
  let sharedPairs = 0;
  const end = offset + 2 * binCount;
  for (let i = offset; i < end; i += 2) {
    const negative = histogram[i];
    const positive = histogram[i + 1];
    credit += positive * (negativesBelow + 0.5 * negative);
    sharedPairs += positive * negative;
    negativesBelow += negative;
    positives += positive;
  }
  const pairs = positives * negativesBelow;
  if (!(pairs > 0)) return { auc: NaN, errorBound: NaN };
  return { auc: credit / pairs, errorBound: (0.5 * sharedPairs) / pairs };
}
