import { ruleWeight } from "./ftrl-weight.js";
import type { HeadState } from "./head-state.js";
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
  const { z, n, headCount: heads } = state;
  const rule = makeFtrlRule(state.info);
  const invAlpha = 1 / rule.alpha;
  return (coordinate, head) => {
    const at = coordinate * heads + head;
    return ruleWeight(rule, invAlpha, coordinate, z[at], n[at]);
  };
}

/**
 * A snapshot's share of the average when it is folded in, `rows` after the
 * previous one: 1 - 2^(-rows / half-life), so that a snapshot's weight in the
 * average halves every `halfLifeRows` rows.
 *
 * Why average at all: with 100-200 leaf coordinates active per row, the
 * per-coordinate steps add up, so the common level of all predictions follows
 * the last few thousand rows and a snapshot's calibration on later days swings
 * by several per cent. Averaging iterates is the classic remedy (Polyak and
 * Juditsky 1992); an exponential average keeps following drift.
 *
 * @example
 * snapshotShare(2500, 20_000); // 0.0830...
 */
export function snapshotShare(rows: number, halfLifeRows: number): number {
  return -Math.expm1(-(rows / halfLifeRows) * Math.LN2);
}

/**
 * The weight each coordinate is exported with. Without averaging, the latest
 * weight. With it, where the latest weight is non-zero, the moving average
 * brought up to the state's row count (the latest weights folded in with the
 * share of the rows since the last snapshot) and divided by its mass, so that
 * the snapshots' shares sum to 1 even early in a run; where L1 has set the
 * latest weight to zero, zero. L1 thus still decides which features a head
 * keeps (an average only decays towards zero and would keep every coordinate
 * ever used), and averaging smooths the values of those it keeps. Reads the
 * state only.
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
    const w = latest(coordinate, head);
    if (w === 0) return 0;
    const a = average[coordinate * heads + head];
    return (a + share * (w - a)) / mass;
  };
}
