import type { Config } from "vega-lite";

/**
 * The look shared by every chart: the page's font stack, quiet grid lines, no frame
 * around the plot. Kept in one place so the charts read as one document.
 *
 * @example
 * compile({ config: CHART_CONFIG, ...spec });
 */
export const CHART_CONFIG: Config = {
  font: "system-ui, -apple-system, 'Segoe UI', Roboto, 'DejaVu Sans', sans-serif",
  background: "white",
  view: { stroke: null },
  axis: {
    labelFontSize: 11,
    titleFontSize: 12,
    titleFontWeight: "normal",
    titleColor: "#333",
    labelColor: "#444",
    gridColor: "#e6e6e6",
    domainColor: "#888",
    tickColor: "#888",
  },
  legend: { labelFontSize: 11, titleFontSize: 12, titleFontWeight: "normal", labelLimit: 220 },
  title: { fontSize: 13, fontWeight: "bold", anchor: "start", color: "#222" },
  header: { labelFontSize: 12, titleFontSize: 12 },
  point: { filled: true },
  line: { strokeWidth: 2 },
};

/**
 * Colours of the freshness arms, in FRESHNESS_ARM_LABELS order (Okabe-Ito, readable with
 * common colour-vision deficiencies).
 *
 * @example
 * const color = { field: "arm", scale: { domain: Object.values(FRESHNESS_ARM_LABELS), range: [...ARM_COLOURS] } };
 */
export const ARM_COLOURS: readonly string[] = ["#d55e00", "#0072b2", "#009e73"];

/**
 * Colours of the usual PSI reading: stable, moderate, significant.
 *
 * @example
 * const scale = { type: "threshold", domain: [0.1, 0.25], range: [...PSI_COLOURS] };
 */
export const PSI_COLOURS: readonly string[] = ["#9ccfa8", "#f0b541", "#c8423b"];
