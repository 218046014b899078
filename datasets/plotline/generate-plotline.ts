import type { WrittenBatch } from "../../trainer/data/write-columns.js";
import { LABEL_UNITS, drawPlotlineLabels } from "./draw-plotline-labels.js";
import { CONTEXT_UNITS, fillPlotlineContext } from "./fill-plotline-context.js";
import { FEATURE_UNITS, fillPlotlineFeatures } from "./fill-plotline-features.js";
import { fillPlotlineProbabilities } from "./fill-plotline-probabilities.js";
import { allocatePlotlineColumns, type PlotlineChunkColumns } from "./plotline-columns.js";
import { resolvePlotlineOptions, type PlotlineOptions } from "./plotline-options.js";
import { buildPlotlinePopulation } from "./plotline-population.js";
import { RandomSource } from "./random-source.js";

/** Rows per block: a block's uniforms and columns stay in the caches between stages. */
const BLOCK_ROWS = 1024;

/**
 * A chunk of generated impressions; a WrittenBatch, so writers take it as it
 * is. Read rows [0, rowCount) only: with reused arrays the last chunk's arrays
 * are longer than its rows.
 */
export interface PlotlineChunk extends WrittenBatch {
  /** The global index of the chunk's first row. */
  readonly firstRow: number;
  readonly columns: PlotlineChunkColumns;
}

/**
 * Which chunks a generator yields: chunk c (counted from 0) when c % of === index.
 * Generators with the same options and shares 0..of-1 yield every chunk once
 * between them, so several threads can generate one log.
 */
export interface PlotlineShare {
  readonly index: number;
  readonly of: number;
}

const WHOLE: PlotlineShare = { index: 0, of: 1 };

/**
 * Generates the Plotline impression log (see DEVELOPERS.md, "The Plotline scenario") in
 * chunks of `chunkRows` rows, in time order, as fresh typed arrays that a caller
 * may keep; with `reuseArrays`, every chunk fills the same arrays instead, which
 * spares allocation for a consumer that is done with a chunk before it asks for
 * the next (the file writers are). The same options give the same rows,
 * whatever the chunk size: each stage of a row (context, features, labels)
 * draws a fixed number of uniforms from its own random stream, row after row,
 * in blocks small enough to stay in cache. With `share`, it yields only its
 * share of the chunks; it still draws past the others' rows (a few percent of
 * the cost of generating them) to keep every stream in step.
 *
 * @example
 * for (const chunk of generatePlotline({ seed: 7, days: 14, rowsPerDay: 10_000 })) {
 *   chunk.columns.true_open; // Float64Array of chunk.rowCount probabilities
 * }
 */
export function* generatePlotline(
  options: PlotlineOptions = {},
  reuseArrays = false,
  share: PlotlineShare = WHOLE,
): Generator<PlotlineChunk> {
  const resolved = resolvePlotlineOptions(options);
  const population = buildPlotlinePopulation(resolved);
  const contextRng = new RandomSource(resolved.seed, 1);
  const featureRng = new RandomSource(resolved.seed, 2);
  const labelRng = new RandomSource(resolved.seed, 3);
  const contextUnits = new Float64Array(BLOCK_ROWS * CONTEXT_UNITS);
  const featureUnits = new Float64Array(BLOCK_ROWS * FEATURE_UNITS);
  const labelUnits = new Float64Array(BLOCK_ROWS * LABEL_UNITS);
  let shared: PlotlineChunkColumns | null = null;
  for (let firstRow = 0; firstRow < resolved.rows; firstRow += resolved.chunkRows) {
    const rowCount = Math.min(resolved.chunkRows, resolved.rows - firstRow);
    if ((firstRow / resolved.chunkRows) % share.of !== share.index) {
      // Another generator's chunk: only advance the random streams past it.
      for (let from = 0; from < rowCount; from += BLOCK_ROWS) {
        const n = Math.min(rowCount, from + BLOCK_ROWS) - from;
        contextRng.fillUnits(contextUnits, n * CONTEXT_UNITS);
        featureRng.fillUnits(featureUnits, n * FEATURE_UNITS);
        labelRng.fillUnits53(labelUnits, n * LABEL_UNITS);
      }
      continue;
    }
    if (reuseArrays && shared === null) shared = allocatePlotlineColumns(resolved.chunkRows);
    const columns = shared ?? allocatePlotlineColumns(rowCount);
    for (let from = 0; from < rowCount; from += BLOCK_ROWS) {
      const to = Math.min(rowCount, from + BLOCK_ROWS);
      const n = to - from;
      contextRng.fillUnits(contextUnits, n * CONTEXT_UNITS);
      fillPlotlineContext(population, contextUnits, columns, from, to, firstRow);
      featureRng.fillUnits(featureUnits, n * FEATURE_UNITS);
      fillPlotlineFeatures(population, resolved.startSeconds, featureUnits, columns, from, to);
      fillPlotlineProbabilities(population, resolved, columns, from, to);
      labelRng.fillUnits53(labelUnits, n * LABEL_UNITS);
      drawPlotlineLabels(labelUnits, columns, from, to);
    }
    yield { rowCount, firstRow, columns };
  }
}
