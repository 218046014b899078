import type { HeadState } from "./head-state.js";
import {
  STAT_FIELDS,
  STAT_LOSS,
  STAT_POSITIVE,
  STAT_PREDICTED,
  STAT_ROWS,
  STAT_WEIGHT,
} from "./progressive-stats.js";

/** Progressive-validation figures over some rows (weighted by the sample weights). */
export interface ProgressiveFigures {
  readonly rows: number;
  readonly weight: number;
  /** Mean log loss of the served probability, each row scored before training on it. */
  readonly logLoss: number;
  /** Observed positive rate. */
  readonly positiveRate: number;
  readonly meanPredicted: number;
  /**
   * Mean log loss / H(p), with p the positive rate of all rows seen up to the end
   * of these rows (He et al. 2014); NaN when p is 0 or 1.
   */
  readonly normalizedEntropy: number;
  /** Mean predicted / observed rate (He et al. 2014); 1 is perfect. */
  readonly calibration: number;
}

export interface HeadProgressiveReport {
  readonly outcome: string;
  readonly overall: ProgressiveFigures;
  /** Time slices in time order; start and end in ms since the Unix epoch. */
  readonly slices: readonly (ProgressiveFigures & {
    readonly start: number;
    readonly end: number;
  })[];
}

/**
 * Turns a state's progressive-validation sums into per-head figures, overall and
 * per time slice. A slice's normalized entropy divides by the entropy of the
 * positive rate of every row seen through that slice: the training positive rate
 * "so far", which is what a model learning on the stream could know.
 *
 * @example
 * for (const head of progressiveReport(state)) console.log(head.outcome, head.overall.normalizedEntropy);
 */
export function progressiveReport(state: HeadState): HeadProgressiveReport[] {
  const stats = state.progressive;
  const heads = state.headCount;
  const order = stats.sliceIndexes
    .map((index, slot) => ({ index, slot }))
    .sort((a, b) => a.index - b.index);
  return state.info.outcomes.map((outcome, h) => {
    const overallAt = h * STAT_FIELDS;
    const total = stats.overall.subarray(overallAt, overallAt + STAT_FIELDS);
    let seenPositive = 0;
    let seenWeight = 0;
    const slices = order.map(({ index, slot }) => {
      const at = (slot * heads + h) * STAT_FIELDS;
      const sums = stats.sliceStats.subarray(at, at + STAT_FIELDS);
      seenPositive += sums[STAT_POSITIVE];
      seenWeight += sums[STAT_WEIGHT];
      return {
        start: index * stats.sliceMs,
        end: (index + 1) * stats.sliceMs,
        ...figures(sums, seenPositive / seenWeight),
      };
    });
    return {
      outcome,
      overall: figures(total, total[STAT_POSITIVE] / total[STAT_WEIGHT]),
      slices,
    };
  });
}

function figures(sums: Float64Array, rateSoFar: number): ProgressiveFigures {
  const weight = sums[STAT_WEIGHT];
  const logLoss = sums[STAT_LOSS] / weight;
  const positiveRate = sums[STAT_POSITIVE] / weight;
  const meanPredicted = sums[STAT_PREDICTED] / weight;
  return {
    rows: sums[STAT_ROWS],
    weight,
    logLoss,
    positiveRate,
    meanPredicted,
    normalizedEntropy: logLoss / binaryEntropy(rateSoFar),
    calibration: meanPredicted / positiveRate,
  };
}

/** H(p) in nats, NaN outside (0, 1) so that NE is NaN there rather than infinite. */
function binaryEntropy(p: number): number {
  if (!(p > 0 && p < 1)) return Number.NaN;
  return -(p * Math.log(p) + (1 - p) * Math.log(1 - p));
}
