import { mkdtemp } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { generatePlotline } from "../../datasets/plotline/generate-plotline.js";
import { plotlineColumns } from "../../datasets/plotline/plotline-columns.js";
import {
  resolvePlotlineOptions,
  type PlotlineOptions,
} from "../../datasets/plotline/plotline-options.js";
import type { WrittenBatch, WrittenColumn } from "../../trainer/data/write-columns.js";
import { writeDataFile } from "../../trainer/data/write-data-file.js";
import { testRandom } from "../trees/tree-test-helpers.js";

/**
 * Plotline features that drive `open` strongly in the generator
 * (datasets/plotline/fill-plotline-probabilities.ts: tie strength by post type,
 * decay with post age by post type, log feed position, the hour-of-day curve).
 */
export const REAL_FEATURES = [
  "tie_strength",
  "post_age_hours",
  "feed_position",
  "hour_of_day",
  "post_type",
] as const;

/** Invented columns of pure noise: uniform draws that no outcome depends on. */
export const NOISE_FEATURES = ["noise_a", "noise_b", "noise_c"] as const;

/** The small Plotline scenario the pruning tests read: four days, no drift. */
export const PRUNING_PLOTLINE: PlotlineOptions = {
  seed: 11,
  days: 4,
  rowsPerDay: 6000,
  newPostTypeDay: null,
  layoutChangeDay: null,
  authors: 200,
  viewers: 2000,
};

/** A dataset schema document for the fixture file: timestamp, the real and noise features, open. */
export function pruningSchemaDocument(): unknown {
  return {
    name: "plotline-pruning",
    columns: [
      { name: "timestamp", role: "timestamp", timeUnit: "s" },
      { name: "post_type", role: "categorical" },
      { name: "tie_strength", role: "numeric", description: "0..1 tie score." },
      { name: "post_age_hours", role: "numeric" },
      { name: "feed_position", role: "numeric" },
      { name: "hour_of_day", role: "numeric" },
      ...NOISE_FEATURES.map((name) => ({ name, role: "numeric", description: "invented noise" })),
      { name: "open", role: "outcome" },
    ],
  };
}

/**
 * Writes the fixture as Parquet in a new temporary directory: Plotline's
 * columns plus the noise columns, each a uniform draw from its own mulberry32
 * stream (3 decimals, like tie_strength).
 */
export async function writePruningFixture(): Promise<{ dir: string; path: string }> {
  const dir = await mkdtemp(join(tmpdir(), "leafcast-pruning-"));
  const path = join(dir, "plotline.parquet");
  const columns: WrittenColumn[] = [
    ...plotlineColumns(resolvePlotlineOptions(PRUNING_PLOTLINE)),
    ...NOISE_FEATURES.map((name): WrittenColumn => ({ name, type: "float64", decimals: 3 })),
  ];
  const streams = NOISE_FEATURES.map((_, i) => testRandom(1000 + i));
  function* batches(): Generator<WrittenBatch> {
    for (const chunk of generatePlotline(PRUNING_PLOTLINE)) {
      const extra: Record<string, Float64Array> = {};
      NOISE_FEATURES.forEach((name, i) => {
        const values = new Float64Array(chunk.rowCount);
        for (let r = 0; r < chunk.rowCount; r++) values[r] = Math.round(streams[i]() * 1000) / 1000;
        extra[name] = values;
      });
      yield { rowCount: chunk.rowCount, columns: { ...chunk.columns, ...extra } };
    }
  }
  await writeDataFile(path, "parquet", columns, batches());
  return { dir, path };
}
