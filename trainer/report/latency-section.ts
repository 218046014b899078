import { chartFigure } from "./chart-figure.js";
import { escapeHtml } from "./escape-html.js";
import { formatFigure } from "./format-figure.js";
import { latencySpec } from "./latency-spec.js";
import type { LatencyReport } from "./report-input.js";

/**
 * The scorer-latency section: the percentile and batch chart and the same figures as a
 * table. Empty string when no latency figures are given.
 *
 * @example
 * html += await latencySection(input.latency);
 */
export async function latencySection(latency: LatencyReport | undefined): Promise<string> {
  if (latency === undefined) return "";
  const p = latency.perItem;
  const cells: [string, string][] = [
    ["p50", formatFigure(p.p50, "ns")],
    ["p90", formatFigure(p.p90, "ns")],
    ["p99", formatFigure(p.p99, "ns")],
    ["p99.9", formatFigure(p.p999, "ns")],
    ["max", formatFigure(p.max, "ns")],
  ];
  for (const b of latency.batches ?? []) {
    cells.push([
      `batch of ${formatFigure(b.batchSize, "count")}, per item`,
      formatFigure(b.nsPerItem, "ns"),
    ]);
  }
  const calls = p.calls === undefined ? "" : ` over ${formatFigure(p.calls, "count")} calls`;
  const description =
    latency.description === undefined
      ? ""
      : `<p class="note">${escapeHtml(latency.description)}</p>\n`;
  return (
    `<section id="latency"><h2>Scorer latency</h2>\n${description}` +
    `<div class="side-by-side">` +
    (await chartFigure(
      latencySpec(latency),
      "latency",
      "chart-latency",
      `Percentiles of scoring one item per call${calls}; batches as nanoseconds per item.`,
    )) +
    `<div class="table-wrap"><table class="summary compact"><tbody>` +
    cells
      .map(([name, value]) => `<tr><th scope="row">${name}</th><td>${value}</td></tr>`)
      .join("") +
    `</tbody></table></div></div></section>\n`
  );
}
