import type { CombinedImportance } from "./importance-of-forests.js";

/**
 * The `count` weakest of the droppable features: those no tree uses first (a
 * feature absent from `combined` counts as unused), then by combined gain share,
 * split count and cover, lowest first; ties by name, so a run is repeatable.
 *
 * @example
 * chooseDrops(step.importance.combined, ["noise_a", "tie_strength", "hour_of_day"], 1); // ["noise_a"]
 */
export function chooseDrops(
  combined: readonly CombinedImportance[],
  droppable: readonly string[],
  count: number,
): string[] {
  const byName = new Map(combined.map((c) => [c.feature, c]));
  const keyOf = (name: string): readonly [number, number, number, number] => {
    const c = byName.get(name);
    if (c === undefined || c.splits === 0) return [0, 0, 0, 0];
    return [1, c.gainShare, c.splits, c.cover];
  };
  return [...droppable]
    .sort((a, b) => {
      const x = keyOf(a);
      const y = keyOf(b);
      for (let i = 0; i < x.length; i++) if (x[i] !== y[i]) return x[i] - y[i];
      return a < b ? -1 : a > b ? 1 : 0;
    })
    .slice(0, Math.max(0, count));
}
