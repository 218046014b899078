import type { FreshnessRecovery } from "./report-input.js";

/** How the NE lost to drift splits between head updates and the trees. */
export interface RecoveryShares {
  /** NE lost to drift: frozen minus trees refit. */
  readonly lost: number;
  /** Share of `lost` that head updates win back: (frozen - headsUpdated) / lost. */
  readonly recovered: number;
  /** Share only a refit closes: (headsUpdated - refit) / lost. */
  readonly leftToTrees: number;
}

/**
 * Splits the NE lost to drift into what head updates recover and what is left to the
 * trees. Null when nothing was lost (the refit arm is no better than the frozen one) or
 * a figure is not finite; the two shares add to 1 and may leave [0, 1] when head updates
 * overshoot or hurt.
 *
 * @example
 * recoveryShares({ outcome: "reply", frozenNe: 0.95, headsUpdatedNe: 0.91, treesRefitNe: 0.9 });
 * // { lost: 0.05, recovered: 0.8, leftToTrees: 0.2 } (up to rounding)
 */
export function recoveryShares(r: FreshnessRecovery): RecoveryShares | null {
  const lost = r.frozenNe - r.treesRefitNe;
  if (!Number.isFinite(lost) || !Number.isFinite(r.headsUpdatedNe) || !(lost > 0)) return null;
  return {
    lost,
    recovered: (r.frozenNe - r.headsUpdatedNe) / lost,
    leftToTrees: (r.headsUpdatedNe - r.treesRefitNe) / lost,
  };
}
