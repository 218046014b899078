import type { FreshnessFigure, FreshnessRecovery } from "../report/report-input.js";

/**
 * Per outcome, the mean NE of each arm over the chosen windows (those after the
 * drift), the input of recoveryShares: lost to drift = frozen - refit, recovered by
 * head updates = (frozen - heads updated) / lost. A plain mean over windows, so
 * each window counts once whatever its rows. Outcomes missing an arm in any chosen
 * window are left out rather than averaged over fewer windows.
 *
 * @example
 * freshnessRecovery(study.figures, ["open", "react"], [3, 4, 5]);
 * // [{ outcome: "open", frozenNe: 0.93, headsUpdatedNe: 0.905, treesRefitNe: 0.9 }, ...]
 */
export function freshnessRecovery(
  figures: readonly FreshnessFigure[],
  outcomes: readonly string[],
  windows: readonly number[],
): FreshnessRecovery[] {
  const chosen = new Set(windows);
  const result: FreshnessRecovery[] = [];
  for (const outcome of outcomes) {
    const mean = (arm: FreshnessFigure["arm"]): number => {
      const values = figures
        .filter((f) => f.outcome === outcome && f.arm === arm && chosen.has(f.window))
        .map((f) => f.ne);
      if (values.length !== chosen.size || values.length === 0) return Number.NaN;
      return values.reduce((sum, v) => sum + v, 0) / values.length;
    };
    const frozenNe = mean("frozen");
    const headsUpdatedNe = mean("heads-updated");
    const treesRefitNe = mean("trees-refit");
    if ([frozenNe, headsUpdatedNe, treesRefitNe].every(Number.isFinite))
      result.push({ outcome, frozenNe, headsUpdatedNe, treesRefitNe });
  }
  return result;
}
