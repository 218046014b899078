/**
 * The report's style sheet, inlined in the page so the file opens offline. System
 * fonts only; tables and charts scroll sideways on narrow screens rather than overflow.
 *
 * @example
 * `<style>${REPORT_CSS}</style>`;
 */
export const REPORT_CSS = `
:root { color-scheme: light; }
* { box-sizing: border-box; }
body { margin: 0; background: #f6f6f3; color: #222;
  font: 15px/1.5 system-ui, -apple-system, "Segoe UI", Roboto, "DejaVu Sans", sans-serif; }
main { max-width: 1320px; margin: 0 auto; padding: 24px 28px 64px; }
header h1 { margin: 0 0 4px; font-size: 26px; }
header .subtitle { margin: 0; color: #555; }
nav { margin: 16px 0 8px; font-size: 14px; }
nav a { margin-right: 14px; color: #0b5394; text-decoration: none; }
nav a:hover { text-decoration: underline; }
section { background: #fff; border: 1px solid #e2e2dc; border-radius: 6px; padding: 16px 20px 20px; margin: 20px 0; }
h2 { margin: 0 0 12px; font-size: 20px; }
h3 { margin: 18px 0 8px; font-size: 16px; }
dl.details { display: grid; grid-template-columns: max-content 1fr; gap: 2px 16px; margin: 12px 0 0; font-size: 14px; }
dl.details dt { color: #555; }
dl.details dd { margin: 0; overflow-wrap: anywhere; }
ul.findings { margin: 0; padding-left: 20px; }
ul.findings li { margin: 4px 0; }
.note { color: #555; font-size: 14px; max-width: 80ch; }
.verdict { padding: 8px 12px; border-radius: 4px; border-left: 4px solid; max-width: 90ch; }
.verdict.refit { background: #fbeceb; border-color: #c8423b; }
.verdict.keep { background: #eaf5ec; border-color: #2e8b57; }
.forest { border-top: 1px solid #eee; padding-top: 4px; }
.forest:first-of-type { border-top: none; }
.side-by-side { display: flex; flex-wrap: wrap; gap: 16px 28px; align-items: flex-start; }
.grid { display: flex; flex-wrap: wrap; gap: 12px 24px; align-items: flex-start; }
figure.chart { margin: 8px 0; width: min-content; max-width: 100%; overflow-x: auto; }
figure.chart svg { display: block; max-width: none; height: auto; }
figcaption { color: #555; font-size: 13px; margin-top: 4px; }
.table-wrap { overflow-x: auto; max-width: 100%; }
table.summary { border-collapse: collapse; font-size: 13px; font-variant-numeric: tabular-nums; margin: 8px 0; }
table.summary th, table.summary td { padding: 4px 8px; text-align: right; border-bottom: 1px solid #eee; white-space: nowrap; }
table.summary thead th { border-bottom: 2px solid #ccc; font-weight: 600; color: #333; }
table.summary tbody th { text-align: left; font-weight: normal; max-width: 28ch; overflow: hidden; text-overflow: ellipsis; }
table.summary tr.model th, table.summary tr.model td { font-weight: 600; }
table.summary tr.baseline th { color: #555; }
table.summary tr.group th { text-align: left; color: #555; font-style: italic; background: #fafaf7; }
table.summary td.text, table.summary th.text { text-align: left; white-space: normal; }
table.summary .bound { color: #888; font-size: 11px; }
code { font: 12.5px/1.4 "DejaVu Sans Mono", Menlo, Consolas, monospace; background: #f1f1ec; padding: 0 3px; border-radius: 3px; overflow-wrap: anywhere; }
.unused { font-size: 14px; max-width: 100ch; }
footer { color: #777; font-size: 12px; margin-top: 24px; }
`;
