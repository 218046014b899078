import type { SeededRandom } from "./seeded-random.js";

/**
 * A seeded mask of round(fraction * columns) columns (at least one) that one
 * tree may split on, or null (all columns) when fraction is 1.
 *
 * @example
 * chooseColumns(10, 0.5, new SeededRandom(1)); // five 1s among ten entries
 */
export function chooseColumns(
  columns: number,
  fraction: number,
  random: SeededRandom,
): Uint8Array | null {
  if (fraction >= 1 || columns === 0) return null;
  const k = Math.max(1, Math.round(fraction * columns));
  const order = Array.from({ length: columns }, (_, c) => c);
  const mask = new Uint8Array(columns);
  for (let i = 0; i < k; i++) {
    const j = i + random.nextInt(columns - i);
    [order[i], order[j]] = [order[j], order[i]];
    mask[order[i]] = 1;
  }
  return mask;
}
