import { formatFigure } from "./format-figure.js";
import type { RecoveryShares } from "./recovery-shares.js";

/**
 * What the recovery shares of one outcome say, in words. Shares outside [0, 1]
 * are not printed as percentages, which would read as nonsense ("recover 317 %"):
 * past 1, updated heads beat the refit trees outright; below 0, head updates
 * made the frozen model worse.
 *
 * @example
 * recoverySentence({ lost: 0.05, recovered: 0.8, leftToTrees: 0.2 });
 * // "head updates recover 80.00 %, 20.00 % is left to the trees (NE lost 0.0500)"
 */
export function recoverySentence(shares: RecoveryShares): string {
  const lost = `NE lost ${formatFigure(shares.lost, "metric")}`;
  if (shares.recovered > 1) {
    return `head updates alone beat refitting the trees: nothing is left to the trees (${lost})`;
  }
  if (shares.recovered < 0) {
    return `head updates recover none of it; only refitting the trees helps (${lost})`;
  }
  return (
    `head updates recover ${formatFigure(shares.recovered, "percent")}, ` +
    `${formatFigure(shares.leftToTrees, "percent")} is left to the trees (${lost})`
  );
}
