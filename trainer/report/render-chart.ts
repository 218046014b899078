import { View, parse } from "vega";
import { compile, type TopLevelSpec } from "vega-lite";
import { CHART_CONFIG } from "./chart-config.js";

/**
 * Renders a Vega-Lite spec to an SVG string in Node (no browser, no canvas), ready to
 * inline in an HTML page. Vega numbers its clip paths and gradients from process-wide
 * counters, so the ids are renamed in order of appearance under `chartId`: the same spec
 * gives the same SVG however many charts were drawn before, and ids never collide
 * between charts on one page. The XML namespace declarations are dropped because the
 * HTML parser supplies them (and the page then holds no URL at all).
 *
 * @example
 * const svg = await renderChart({ data: { values: [{ x: 1 }] }, mark: "point", encoding: { x: { field: "x", type: "quantitative" } } }, "chart-1");
 */
export async function renderChart(spec: TopLevelSpec, chartId: string): Promise<string> {
  const vegaSpec = compile({ config: CHART_CONFIG, ...spec }).spec;
  const view = new View(parse(vegaSpec), { renderer: "none" });
  try {
    const svg = await view.toSVG();
    return renameIds(stripNamespaces(svg), chartId);
  } finally {
    view.finalize();
  }
}

// Vega escapes ">" inside attribute values, so /<[^>]+>/ finds whole tags; text between
// tags (user labels, where quotes stay unescaped) is never rewritten.
const TAG = /<[^>]+>/g;

function stripNamespaces(svg: string): string {
  return svg.replace(TAG, (tag) => tag.replace(/ xmlns(?::xlink)?="[^"]*"/g, ""));
}

function renameIds(svg: string, chartId: string): string {
  const renamed = new Map<string, string>();
  for (const [tag] of svg.matchAll(TAG)) {
    const id = / id="([^"]+)"/.exec(tag)?.[1];
    if (id !== undefined && !renamed.has(id)) renamed.set(id, `${chartId}-def${renamed.size}`);
  }
  if (renamed.size === 0) return svg;
  const rename = (id: string): string => renamed.get(id) ?? id;
  return svg.replace(TAG, (tag) =>
    tag
      .replace(/ id="([^"]+)"/g, (_, id: string) => ` id="${rename(id)}"`)
      .replace(/url\(#([^)]+)\)/g, (_, id: string) => `url(#${rename(id)})`)
      .replace(/href="#([^"]+)"/g, (_, id: string) => `href="#${rename(id)}"`),
  );
}
