import { ftrlWeight } from "./ftrl-weight.js";
import type { HeadState } from "./head-state.js";
import { COORDINATE_PAGE_SHIFT } from "./head-state.js";
import { makeFtrlRule } from "./make-ftrl-rule.js";

/**
 * The latest FTRL-Proximal weight of (coordinate, head) from the state's z and n:
 * what progressive validation scores with. The bias is never L1- or L2-shrunk.
 *
 * @example
 * const latest = latestWeightOf(state);
 * latest(state.biasCoordinate, 0); // the first head's bias
 */
export function latestWeightOf(state: HeadState): (coordinate: number, head: number) => number {
  const { z, n, headCount: heads, biasCoordinate } = state;
  const rule = makeFtrlRule(state.info);
  const invAlpha = 1 / rule.alpha;
  return (coordinate, head) => {
    const at = coordinate * heads + head;
    const bias = coordinate === biasCoordinate;
    return ftrlWeight(
      z[at],
      Math.sqrt(n[at]),
      invAlpha,
      rule.beta,
      bias ? 0 : rule.lambda1,
      bias ? 0 : rule.lambda2,
    );
  };
}

/** A snapshot's share of the average when it is folded in, `rows` after the previous one: 1 - 2^(-rows / half-life). */
function snapshotShare(rows: number, halfLifeRows: number): number {
  return -Math.expm1(-(rows / halfLifeRows) * Math.LN2);
}

/**
 * Folds the latest weights into the state's exponential moving average:
 * average += share * (latest - average), share = 1 - 2^(-everyRows / halfLifeRows).
 * learnHeads calls it, with the state drained, whenever the row count reaches a
 * multiple of everyRows, so a resumed run folds at the same rows as an
 * uninterrupted one. Only written pages are visited: elsewhere the weights and
 * their average are zero.
 *
 * Why: with 100-200 leaf coordinates active per row, the per-coordinate steps
 * add up, so the common level of all predictions follows the last few thousand
 * rows and a snapshot's calibration on later days swings by several per cent.
 * Averaging iterates is the classic remedy (Polyak and Juditsky 1992); an
 * exponential average keeps following drift.
 *
 * @example
 * foldWeightSnapshot(state); // state.average and state.averageMass move on
 */
export function foldWeightSnapshot(state: HeadState): void {
  const { average, headCount: heads, coordinateCount } = state;
  const averaging = state.info.averaging;
  if (average === null || averaging === null) {
    throw new Error("foldWeightSnapshot: the state has no averaging");
  }
  const share = snapshotShare(averaging.everyRows, averaging.halfLifeRows);
  const latest = latestWeightOf(state);
  const pageSize = 2 ** COORDINATE_PAGE_SHIFT;
  state.writtenPages.forEach((written, page) => {
    if (written === 0) return;
    const end = Math.min(coordinateCount, (page + 1) * pageSize);
    for (let c = page * pageSize; c < end; c++) {
      for (let h = 0, at = c * heads; h < heads; h++, at++) {
        average[at] += share * (latest(c, h) - average[at]);
      }
    }
  });
  state.averageMass += share * (1 - state.averageMass);
}

/**
 * The weight each coordinate is exported with. Without averaging, the latest
 * weight. With it, the moving average brought up to the state's row count (the
 * latest weights folded in with the share of the rows since the last snapshot)
 * and divided by its mass, so that the snapshots' shares sum to 1 even early in
 * a run. Reads the state only.
 *
 * @example
 * const weightOf = exportedWeightOf(state);
 * weightOf(coordinate, head);
 */
export function exportedWeightOf(state: HeadState): (coordinate: number, head: number) => number {
  const latest = latestWeightOf(state);
  const { average, headCount: heads } = state;
  const averaging = state.info.averaging;
  if (average === null || averaging === null) return latest;
  const share = snapshotShare(state.rowCount % averaging.everyRows, averaging.halfLifeRows);
  const mass = state.averageMass + share * (1 - state.averageMass);
  if (mass === 0) return latest;
  return (coordinate, head) => {
    const a = average[coordinate * heads + head];
    return (a + share * (latest(coordinate, head) - a)) / mass;
  };
}
