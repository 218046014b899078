/**
 * Reads the charts out of a rendered report with plain regular expressions over Vega's
 * SVG output: each chart is a <figure data-chart> holding one <svg>, and each drawn mark
 * set is a <g class="mark-KIND role-mark"> group whose children are leaf elements.
 */
export interface ChartMarks {
  readonly id: string;
  readonly kind: string;
  /** Leaf elements per mark kind, e.g. { rect: 320 }. */
  readonly marks: Readonly<Record<string, number>>;
  readonly svg: string;
}

export function chartMarks(html: string): ChartMarks[] {
  const charts: ChartMarks[] = [];
  const figure = /<figure class="chart" id="([^"]+)" data-chart="([^"]+)">(.*?)<\/figure>/gs;
  for (const [, id, kind, body] of html.matchAll(figure)) {
    const marks: Record<string, number> = {};
    const group = /<g class="mark-(\w+) role-mark[^"]*"[^>]*>(.*?)<\/g>/gs;
    for (const [, mark, children] of body.matchAll(group)) {
      const leaves = children.match(/<(path|line|text)\b/g)?.length ?? 0;
      marks[mark] = (marks[mark] ?? 0) + leaves;
    }
    const svg = body.match(/<svg\b.*<\/svg>/s)?.[0] ?? "";
    charts.push({ id, kind, marks, svg });
  }
  return charts;
}
