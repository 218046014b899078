import type { LatencyRow } from "./latency-row.js";

/**
 * The latency table as aligned text: microseconds per item for batches (split
 * into trees and heads) and the single-call distribution.
 *
 * @example
 * console.log(formatLatencyTable(latencyTable()));
 */
export function formatLatencyTable(rows: readonly LatencyRow[]): string {
  const us = (ns: number): string => (ns / 1000).toFixed(2);
  const header = [
    "trees",
    "depth",
    "heads",
    "artifact",
    "batch us/item",
    "(trees",
    "heads)",
    "single p50",
    "p90",
    "p99",
    "p99.9",
    "max",
    "(trees p50)",
  ];
  const body = rows.map((r) => [
    String(r.trees),
    String(r.depth),
    String(r.heads),
    r.artifactBytes >= 1 << 20
      ? `${(r.artifactBytes / (1 << 20)).toFixed(1)} MiB`
      : `${(r.artifactBytes / 1024).toFixed(0)} KiB`,
    us(r.batchNsPerItem),
    us(r.batchTreesNsPerItem),
    us(r.batchHeadsNsPerItem),
    us(r.singleP50),
    us(r.singleP90),
    us(r.singleP99),
    us(r.singleP999),
    us(r.singleMax),
    us(r.singleTreesP50),
  ]);
  const widths = header.map((h, c) => Math.max(h.length, ...body.map((line) => line[c].length)));
  const render = (cells: readonly string[]): string =>
    cells.map((cell, c) => cell.padStart(widths[c])).join("  ");
  return [
    render(header),
    ...body.map(render),
    "(times in microseconds; single = one scoreOne call)",
  ].join("\n");
}
