import { chartFigure } from "./chart-figure.js";
import { escapeHtml } from "./escape-html.js";
import { IMPORTANCE_TOP, importanceSpec } from "./importance-spec.js";
import type { ForestImportance } from "./report-input.js";

/**
 * The feature-importance section: per forest the gain, cover and split-count bars and
 * the features no tree in it splits on. Empty string when there is no importance data.
 *
 * @example
 * html += await importanceSection(input.importance);
 */
export async function importanceSection(
  forests: readonly ForestImportance[] | undefined,
): Promise<string> {
  if (forests === undefined || forests.length === 0) return "";
  const parts: string[] = [`<section id="importance"><h2>Feature importance</h2>\n`];
  for (let i = 0; i < forests.length; i++) {
    const forest = forests[i];
    const used = forest.features.filter((f) => f.splits > 0).length;
    const unused = forest.features.filter((f) => f.splits === 0).map((f) => f.feature);
    const shown = Math.min(used, IMPORTANCE_TOP);
    const caption =
      `${forest.forest}: ${used} of ${forest.features.length} features used` +
      (shown < used ? `; the ${shown} with the most gain are drawn.` : ".");
    parts.push(`<article class="forest" id="importance-${i}">`);
    const figure = await chartFigure(
      importanceSpec(forest),
      "importance",
      `chart-importance-${i}`,
      caption,
    );
    parts.push(
      figure === ""
        ? `<h3>${escapeHtml(forest.forest)}</h3><p>No tree splits on any feature.</p>`
        : figure,
    );
    if (unused.length > 0) {
      const names = unused.map((name) => `<code>${escapeHtml(name)}</code>`).join(", ");
      parts.push(
        `<p class="unused">Features no tree in ${escapeHtml(forest.forest)} splits on (${unused.length}): ${names}</p>`,
      );
    }
    parts.push(`</article>\n`);
  }
  parts.push(`</section>\n`);
  return parts.join("");
}
