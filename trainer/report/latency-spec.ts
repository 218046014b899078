import type { TopLevelSpec } from "vega-lite";
import type { LatencyReport } from "./report-input.js";

/**
 * The scorer's latency: per-call percentiles of scoring one item (p50 to max) and, when
 * given, nanoseconds per item by batch size. The percentile axis turns logarithmic when
 * the tail is more than 20 times the median, so a slow maximum (a garbage collection,
 * say) does not flatten the rest.
 *
 * @example
 * const spec = latencySpec({ perItem: { p50: 800, p90: 950, p99: 2100, p999: 9000, max: 41000 } });
 */
export function latencySpec(latency: LatencyReport): TopLevelSpec {
  const p = latency.perItem;
  const percentiles = [
    { name: "p50", ns: p.p50 },
    { name: "p90", ns: p.p90 },
    { name: "p99", ns: p.p99 },
    { name: "p99.9", ns: p.p999 },
    { name: "max", ns: p.max },
  ];
  const logScale = p.p50 > 0 && p.max / p.p50 > 20;
  // Bars on a log scale need a floor to start from (log 0 is undefined): a power of ten.
  const floor = logScale ? 10 ** Math.floor(Math.log10(p.p50)) : 0;
  const ceiling = logScale ? 10 ** Math.ceil(Math.log10(p.max)) : 0;
  const decades: number[] = [];
  if (logScale) for (let v = floor; v <= ceiling; v *= 10) decades.push(v);
  const perItem = {
    title: {
      text: "One item per call",
      subtitle: logScale ? "nanoseconds, log scale" : "nanoseconds",
    },
    width: 360,
    height: { step: 22 },
    data: { values: percentiles },
    layer: [
      {
        mark: { type: "bar" as const, color: "#0072b2", height: 14 },
        encoding: logScale ? { x2: { datum: floor } } : {},
      },
      {
        mark: { type: "text" as const, align: "left" as const, dx: 4, fontSize: 10, color: "#333" },
        encoding: { text: { field: "ns", type: "quantitative" as const, format: ",.0f" } },
      },
    ],
    encoding: {
      y: {
        field: "name",
        type: "nominal" as const,
        sort: percentiles.map((d) => d.name),
        title: null,
      },
      x: {
        field: "ns",
        type: "quantitative" as const,
        title: "ns per call",
        scale: logScale ? { type: "log" as const, domain: [floor, ceiling] } : {},
        axis: logScale ? { format: "~s", values: decades } : { format: ".2~s" },
      },
    },
  };
  const batches = latency.batches ?? [];
  if (batches.length === 0) return perItem;
  const sizes = batches.map((b) => String(b.batchSize));
  const perBatch = {
    title: { text: "Batches", subtitle: "nanoseconds per item by batch size" },
    width: 360,
    height: { step: 22 },
    data: { values: batches.map((b) => ({ size: String(b.batchSize), ns: b.nsPerItem })) },
    layer: [
      { mark: { type: "bar" as const, color: "#009e73", height: 14 } },
      {
        mark: { type: "text" as const, align: "left" as const, dx: 4, fontSize: 10, color: "#333" },
        encoding: { text: { field: "ns", type: "quantitative" as const, format: ",.0f" } },
      },
    ],
    encoding: {
      y: { field: "size", type: "nominal" as const, sort: sizes, title: "batch size" },
      x: {
        field: "ns",
        type: "quantitative" as const,
        title: "ns per item",
        axis: { format: ".2~s" },
      },
    },
  };
  return { vconcat: [perItem, perBatch], spacing: 24 };
}
