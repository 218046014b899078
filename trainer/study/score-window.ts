import type { Scorer } from "../../scorer/scorer.js";
import type { CategoryDictionary } from "../data/category-dictionary.js";
import { categoryColumn, labelColumn, numberColumn } from "../data/column-batch.js";
import { openDataFile } from "../data/open-data-file.js";
import type { MetricAccumulator } from "../metrics/metric-accumulator.js";
import type { ResolvedSchema } from "../schema/load-dataset-schema.js";

/**
 * One predictor scored over a window: a scorer (trees and heads, or trees alone),
 * or a constant probability per outcome (the training-rate baseline).
 */
export interface WindowTarget {
  readonly scorer: Scorer | null;
  /** Per outcome the constant prediction; read when `scorer` is null. */
  readonly constant?: ReadonlyMap<string, number>;
  /** Per outcome, the accumulators its predictions feed (one per grouping the study keeps). */
  readonly sinks: ReadonlyMap<string, readonly MetricAccumulator[]>;
}

/** Where the frozen trees' leaf counts go: counts[encoded leaf index] += 1 per row. */
export interface LeafCountTarget {
  readonly scorer: Scorer;
  readonly counts: Float64Array;
}

export interface ScoreWindowOptions {
  readonly batchRows: number;
  /** Shared across windows so a category code means one value in every window. */
  readonly dictionaries: Map<string, CategoryDictionary>;
  /** A categorical column whose codes are passed to the accumulators as segments. */
  readonly segmentColumn?: string | null;
  readonly leafCounts?: LeafCountTarget;
  readonly badRows?: "fail" | "skip";
  readonly signal?: AbortSignal;
}

/**
 * Reads the files of one window once and scores every batch with every target,
 * feeding each outcome's predictions, labels and weights to its accumulators; no
 * target learns anything here, so a window is scored only by what was learned
 * before it. Optionally counts the rows reaching each leaf of the given trees.
 * Returns the rows read.
 *
 * @example
 * const rows = await scoreWindow(window.files, schema, [frozen, updated, refit], { batchRows: 65536, dictionaries });
 */
export async function scoreWindow(
  files: readonly string[],
  schema: ResolvedSchema,
  targets: readonly WindowTarget[],
  options: ScoreWindowOptions,
): Promise<number> {
  let rows = 0;
  let constant = new Float64Array(0);
  let leaves = new Int32Array(0);
  const segmentColumn = options.segmentColumn ?? null;
  for (const file of files) {
    const reader = openDataFile(file, schema, {
      batchRows: options.batchRows,
      dictionaries: options.dictionaries,
      badRows: options.badRows,
      signal: options.signal,
    });
    for await (const batch of reader.batches()) {
      const n = batch.rowCount;
      if (n === 0) continue;
      rows += n;
      const columns = {
        weight: schema.weight === null ? undefined : numberColumn(batch, schema.weight),
        segment: segmentColumn === null ? undefined : categoryColumn(batch, segmentColumn).codes,
      };
      if (constant.length < n) constant = new Float64Array(n);
      for (const target of targets) {
        const scores = target.scorer === null ? null : target.scorer.scoreBatch(batch);
        for (const [outcome, sinks] of target.sinks) {
          let predicted: Float64Array;
          if (scores !== null) {
            predicted = scores.probability[outcome];
          } else {
            predicted = constant.subarray(0, n);
            predicted.fill(target.constant?.get(outcome) ?? Number.NaN);
          }
          const label = labelColumn(batch, outcome);
          for (const sink of sinks) sink.add(predicted, label, columns);
        }
      }
      const count = options.leafCounts;
      if (count !== undefined) {
        const trees = count.scorer.layout.treeCount;
        if (leaves.length < n * trees) leaves = new Int32Array(n * trees);
        count.scorer.traverseBatch(batch, leaves);
        addLeafCounts(leaves, n * trees, count.counts);
      }
    }
  }
  return rows;
}

/** Kernel: one count per reached leaf (entries are encoded leaf indexes). */
function addLeafCounts(leaves: Int32Array, entries: number, counts: Float64Array): void {
  for (let i = 0; i < entries; i++) counts[leaves[i]]++;
}
