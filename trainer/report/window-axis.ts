/** Axis settings for a band of window labels. */
export interface WindowAxis {
  readonly labelAngle: number;
  readonly labelLimit: number;
  readonly labelOverlap: boolean;
}

/**
 * Tilts window labels when they would not fit side by side in the plot width (about 7
 * px per character at the 11 px axis font), so dates never print over each other.
 * With very many windows Vega thins the labels.
 *
 * @example
 * windowAxis(["05-06", "05-07"], 200); // { labelAngle: 0, labelLimit: 90, labelOverlap: true }
 */
export function windowAxis(windows: readonly string[], plotWidth: number): WindowAxis {
  const longest = windows.reduce((m, w) => Math.max(m, w.length), 0);
  const step = plotWidth / Math.max(1, windows.length);
  const fits = longest * 7 + 8 <= step;
  // Tilted labels stack at step * sin(40°) apart; let Vega thin them only when that is
  // less than a line of text (its box test would thin them long before they touch).
  return { labelAngle: fits ? 0 : -40, labelLimit: 90, labelOverlap: fits || step * 0.64 < 12 };
}
