import type { TopLevelSpec } from "vega-lite";
import { escapeHtml } from "./escape-html.js";
import { renderChart } from "./render-chart.js";

/**
 * Renders a spec and wraps the SVG in a figure that names the chart kind
 * (`data-chart`), so tests and readers can find every chart. `chartId` is made by the
 * report from section and position, never from user text. A null spec (no data to
 * draw) gives an empty string.
 *
 * @example
 * html += await chartFigure(reliabilitySpec("reply", bins), "reliability", "chart-reliability-0", "10 bins");
 */
export async function chartFigure(
  spec: TopLevelSpec | null,
  kind: string,
  chartId: string,
  caption?: string,
): Promise<string> {
  if (spec === null) return "";
  const svg = await renderChart(spec, chartId);
  const figcaption = caption === undefined ? "" : `<figcaption>${escapeHtml(caption)}</figcaption>`;
  return `<figure class="chart" id="${chartId}" data-chart="${kind}">${svg}${figcaption}</figure>\n`;
}
