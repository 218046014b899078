import type { ScoreItem } from "../../scorer/score-item.js";
import { openDataFile } from "../data/open-data-file.js";
import type { ResolvedSchema } from "../schema/load-dataset-schema.js";

/**
 * Reads the first `count` rows of a log as the items a service would send the
 * scorer (feature name to number or category text), for latency measurement on
 * realistic inputs. Only feature columns are kept: no ids, labels or truths.
 *
 * @example
 * const items = await scoreItemsFromFile("runs/demo/data/day-42.csv", schema, 2000);
 */
export async function scoreItemsFromFile(
  path: string,
  schema: ResolvedSchema,
  count: number,
): Promise<ScoreItem[]> {
  const items: Record<string, number | string | null>[] = [];
  const reader = openDataFile(path, schema, { batchRows: Math.min(count, 65536) });
  for await (const batch of reader.batches()) {
    const take = Math.min(batch.rowCount, count - items.length);
    const start = items.length;
    for (let r = 0; r < take; r++) items.push({});
    for (const name of [...schema.numeric, ...schema.categorical]) {
      const column = batch.columns.get(name);
      if (column === undefined) continue;
      for (let r = 0; r < take; r++) {
        const item = items[start + r];
        if (column.kind === "number")
          item[name] = Number.isNaN(column.values[r]) ? null : column.values[r];
        else if (column.kind === "category") {
          item[name] = column.codes[r] < 0 ? null : column.dictionary.valueOf(column.codes[r]);
        }
      }
    }
    if (items.length >= count) break;
  }
  return items;
}
