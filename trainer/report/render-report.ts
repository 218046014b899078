import { checkReportInput } from "./check-report-input.js";
import { escapeHtml } from "./escape-html.js";
import { freshnessSection } from "./freshness-section.js";
import { headsSection } from "./heads-section.js";
import { importanceSection } from "./importance-section.js";
import { latencySection } from "./latency-section.js";
import { pruningSection } from "./pruning-section.js";
import { REPORT_CSS } from "./report-css.js";
import type { ReportInput } from "./report-input.js";
import { stalenessSection } from "./staleness-section.js";

const SECTION_TITLES: readonly [string, string][] = [
  ["findings", "Findings"],
  ["heads", "Outcome heads"],
  ["freshness", "Freshness study"],
  ["staleness", "Tree staleness"],
  ["importance", "Feature importance"],
  ["pruning", "Feature pruning"],
  ["latency", "Scorer latency"],
];

/**
 * Renders the report as one self-contained HTML page: inline CSS, charts drawn to
 * inline SVG in Node by Vega-Lite, no script and no URL, so it opens offline and looks
 * the same in any browser. A content policy in the page forbids loading anything, as a
 * second guard around user text. Sections without data are left out; the same input
 * gives the same bytes. Checks the input first (see checkReportInput).
 *
 * @example
 * const html = await renderReport({ title: "Plotline, May", heads: [{ outcome: "reply", overall }] });
 */
export async function renderReport(input: ReportInput): Promise<string> {
  checkReportInput(input);
  const title = input.title ?? "Leafcast report";
  // Charts are drawn one after another: Vega's layout is synchronous work, and a fixed
  // order keeps the output byte-stable.
  const sections: [string, string][] = [
    ["findings", findingsSection(input.findings)],
    ["heads", await headsSection(input.heads)],
    ["freshness", await freshnessSection(input.freshness)],
    ["staleness", await stalenessSection(input.staleness)],
    ["importance", await importanceSection(input.importance)],
    ["pruning", await pruningSection(input.pruning)],
    ["latency", await latencySection(input.latency)],
  ];
  const present = sections.filter(([, html]) => html !== "");
  const nav = present
    .map(([id]) => `<a href="#${id}">${SECTION_TITLES.find(([key]) => key === id)?.[1] ?? id}</a>`)
    .join("");
  const body =
    present.length === 0
      ? `<section><p>No data was given for any section.</p></section>\n`
      : present.map(([, html]) => html).join("");
  return (
    `<!doctype html>\n<html lang="en">\n<head>\n<meta charset="utf-8">\n` +
    `<meta name="viewport" content="width=device-width, initial-scale=1">\n` +
    `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'">\n` +
    `<title>${escapeHtml(title)}</title>\n<style>${REPORT_CSS}</style>\n</head>\n<body>\n<main>\n` +
    `<header><h1>${escapeHtml(title)}</h1>` +
    (input.subtitle === undefined ? "" : `<p class="subtitle">${escapeHtml(input.subtitle)}</p>`) +
    detailsList(input) +
    (nav === "" ? "" : `<nav aria-label="sections">${nav}</nav>`) +
    `</header>\n${body}<footer>Written by Leafcast. Charts drawn with Vega-Lite.</footer>\n</main>\n</body>\n</html>\n`
  );
}

function findingsSection(findings: readonly string[] | undefined): string {
  if (findings === undefined || findings.length === 0) return "";
  const items = findings.map((f) => `<li>${escapeHtml(f)}</li>`).join("\n");
  return `<section id="findings"><h2>Findings</h2>\n<ul class="findings">\n${items}\n</ul></section>\n`;
}

function detailsList(input: ReportInput): string {
  if (input.details === undefined || input.details.length === 0) return "";
  const rows = input.details
    .map((d) => `<dt>${escapeHtml(d.name)}</dt><dd>${escapeHtml(d.value)}</dd>`)
    .join("");
  return `<dl class="details">${rows}</dl>`;
}
