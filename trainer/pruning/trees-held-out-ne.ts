import { ForestEvaluator } from "../../scorer/forest-evaluator.js";
import type { FeatureContract, ForestModel } from "../../scorer/model-types.js";
import type { CategoryDictionary } from "../data/category-dictionary.js";
import { normalizedEntropy } from "../metrics/normalized-entropy.js";
import type { SampleRows } from "./read-pruning-sample.js";

/**
 * Normalized entropy (He et al. 2014: mean log loss over the entropy of the
 * training positive rate) of each forest on its own, sigmoid(baseLogit + reached
 * leaf values), on held-out rows. The forests are evaluated by the scorer's own
 * traversal (ForestEvaluator), on the raw feature values, so held-out rows need no
 * binning. Category codes index `dictionaries` and are mapped to the contract's
 * tree codes here.
 *
 * @example
 * treesHeldOutNe(forests, contract, sample.heldOut, sample.dictionaries, sample.trainingRate);
 * // { open: 0.912, react: 0.874 }
 */
export function treesHeldOutNe(
  forests: readonly ForestModel[],
  contract: FeatureContract,
  rows: SampleRows,
  dictionaries: ReadonlyMap<string, CategoryDictionary>,
  trainingRate: ReadonlyMap<string, number>,
): Record<string, number> {
  const n = rows.rowCount;
  const numeric = contract.numeric.map((name) => columnOf(rows.numbers, name));
  const categorical = contract.categorical.map((feature) => {
    const codes = columnOf(rows.codes, feature.name);
    const texts = dictionaries.get(feature.name)?.list() ?? [];
    const treeCode = new Map(feature.values.map((value, k) => [value, k]));
    const lookup = Int32Array.from(texts, (text) => treeCode.get(text) ?? -1);
    const out = new Int32Array(n);
    for (let r = 0; r < n; r++) out[r] = codes[r] < 0 ? -1 : lookup[codes[r]];
    return out;
  });
  const input = { rowCount: n, numeric, categorical };
  const raw = new Float64Array(n);
  const p = new Float64Array(n);
  const ne: Record<string, number> = {};
  for (const forest of forests) {
    new ForestEvaluator(forest, contract).rawScores(input, raw);
    for (let r = 0; r < n; r++) p[r] = 1 / (1 + Math.exp(-raw[r]));
    const label = columnOf(rows.labels, forest.outcome);
    const rate = trainingRate.get(forest.outcome) ?? NaN;
    ne[forest.outcome] = normalizedEntropy(p, label, rate, rows.weight ?? undefined);
  }
  return ne;
}

function columnOf<T>(columns: ReadonlyMap<string, T>, name: string): T {
  const column = columns.get(name);
  if (column === undefined) throw new Error(`pruning: no held-out column "${name}"`);
  return column;
}
