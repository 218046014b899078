import type { LatencyOptions } from "../../scorer/measure-latency.js";
import type { ScoreItem } from "../../scorer/score-item.js";
import { buildArtifact } from "./build-artifact.js";
import { latencyRow, type LatencyRow } from "./latency-row.js";
import { syntheticItems } from "./synthetic-items.js";
import { syntheticModel } from "./synthetic-model.js";

/** What latencyTable measures, besides measureLatency's own options. */
export interface LatencyTableOptions extends LatencyOptions {
  /** Tree counts to measure. Default [100, 300, 1000]. */
  readonly trees?: readonly number[];
  /** Depths to measure. Default [6, 8]. */
  readonly depths?: readonly number[];
  /** Generated Plotline items to score. Default 2000. */
  readonly items?: number;
  /** Called after each row, e.g. to print progress. */
  readonly onRow?: (row: LatencyRow) => void;
}

/**
 * The latency table for generated artifacts of every tree count and depth asked
 * (six heads, hashed categoricals, a cross, standardized numerics), scored on
 * generated Plotline items. For a trained artifact and real items use latencyRow.
 *
 * @example
 * const rows = latencyTable({ trees: [100, 300, 1000], depths: [6, 8] });
 * console.log(formatLatencyTable(rows));
 */
export function latencyTable(options: LatencyTableOptions = {}): LatencyRow[] {
  const items: ScoreItem[] = syntheticItems(options.items ?? 2000);
  const rows: LatencyRow[] = [];
  for (const depth of options.depths ?? [6, 8]) {
    for (const trees of options.trees ?? [100, 300, 1000]) {
      const artifact = buildArtifact(syntheticModel({ trees, depth }));
      const row = latencyRow(artifact, items, options);
      rows.push(row);
      options.onRow?.(row);
    }
  }
  return rows;
}
