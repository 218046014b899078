import type { ScoreItem } from "../../scorer/score-item.js";
import { SYNTHETIC_CATEGORICAL, SYNTHETIC_CROPS, SYNTHETIC_NUMERIC } from "./synthetic-model.js";
import { seededRandom } from "./synthetic-random.js";

/**
 * Random Plotline items for a synthetic model: about 5 % of values missing and
 * some categorical values the trees never saw.
 *
 * @example
 * const items = syntheticItems(1000, 7);
 */
export function syntheticItems(count: number, seed = 2): ScoreItem[] {
  const random = seededRandom(seed);
  const items: ScoreItem[] = [];
  for (let i = 0; i < count; i++) {
    const item: Record<string, number | string | null> = {};
    SYNTHETIC_NUMERIC.forEach((name, f) => {
      item[name] = random() < 0.05 ? null : Math.round(random() * 100 * (f + 1)) / 100;
    });
    for (const feature of SYNTHETIC_CATEGORICAL) {
      const r = random();
      item[feature.name] =
        r < 0.05
          ? null
          : r < 0.08
            ? "unlisted"
            : feature.values[Math.floor(random() * feature.values.length)];
    }
    item.crop =
      random() < 0.05 ? null : SYNTHETIC_CROPS[Math.floor(random() * SYNTHETIC_CROPS.length)];
    item.viewer_region = `region-${Math.floor(random() * 40)}`;
    items.push(item);
  }
  return items;
}
