import type { ScorerArtifact } from "../../scorer/artifact.generated.js";
import { loadScorer } from "../../scorer/load-scorer.js";
import { measureLatency, type LatencyOptions } from "../../scorer/measure-latency.js";
import type { ScoreItem } from "../../scorer/score-item.js";
import { formatArtifactText } from "./format-artifact-text.js";

/** One line of the latency table. Times in nanoseconds. */
export interface LatencyRow {
  readonly trees: number;
  readonly depth: number;
  readonly heads: number;
  readonly artifactBytes: number;
  /** Parsing, checking and compiling the artifact text, milliseconds. */
  readonly loadMs: number;
  readonly items: number;
  readonly batchNsPerItem: number;
  readonly batchTreesNsPerItem: number;
  readonly batchHeadsNsPerItem: number;
  readonly singleP50: number;
  readonly singleP90: number;
  readonly singleP99: number;
  readonly singleP999: number;
  readonly singleMax: number;
  readonly singleTreesP50: number;
  readonly singleHeadsP50: number;
}

/**
 * Loads an artifact the way a service would (from its text) and measures its
 * latency on the given items (see measureLatency).
 *
 * @example
 * const row = latencyRow(artifact, items, { repetitions: 5 });
 * row.singleP50; // ns per scoreOne call
 */
export function latencyRow(
  artifact: ScorerArtifact,
  items: readonly ScoreItem[],
  options: LatencyOptions = {},
): LatencyRow {
  const text = formatArtifactText(artifact);
  const t0 = performance.now();
  const scorer = loadScorer(text);
  const loadMs = performance.now() - t0;
  const report = measureLatency(scorer, items, options);
  const depths = [...new Set(artifact.forests.map((f) => f.depth))];
  return {
    trees: scorer.layout.treeCount,
    depth: depths.length === 1 ? depths[0] : Math.max(0, ...depths),
    heads: scorer.outcomes.length,
    artifactBytes: new TextEncoder().encode(text).length,
    loadMs,
    items: items.length,
    batchNsPerItem: report.batch.nsPerItem,
    batchTreesNsPerItem: report.batch.treesNsPerItem,
    batchHeadsNsPerItem: report.batch.headsNsPerItem,
    singleP50: report.single.total.p50,
    singleP90: report.single.total.p90,
    singleP99: report.single.total.p99,
    singleP999: report.single.total.p999,
    singleMax: report.single.total.max,
    singleTreesP50: report.single.trees.p50,
    singleHeadsP50: report.single.headsP50,
  };
}
