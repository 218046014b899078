import { encodedLayout } from "../../scorer/encoded-layout.js";
import type { EncodingSpec, ForestModel, HeadModel } from "../../scorer/model-types.js";

/**
 * Heads that reproduce each forest on its own, for the "trees only" baseline: the
 * head of a forest's outcome has the forest's base log-odds as bias and each leaf
 * value as the weight of that leaf's slot, so the scorer serves
 * sigmoid(baseLogit + sum of reached leaf values), the boosted trees' own
 * prediction. Outcomes without a forest get no head.
 *
 * @example
 * const heads = forestHeadModels(forests, state.info.encoding, ["open", "reply"]);
 * createScorer({ contract, forests, encoding, heads, valueWeights: heads.map(() => 1) });
 */
export function forestHeadModels(
  forests: readonly ForestModel[],
  encoding: Pick<EncodingSpec, "hashBits" | "numeric">,
  outcomes: readonly string[],
): HeadModel[] {
  const layout = encodedLayout(forests, encoding);
  const heads: HeadModel[] = [];
  for (const outcome of outcomes) {
    const f = forests.findIndex((forest) => forest.outcome === outcome);
    if (f < 0) continue;
    const forest = forests[f];
    const leaves = 1 << forest.depth;
    const index = new Int32Array(forest.trees.length * leaves);
    const weight = new Float64Array(index.length);
    forest.trees.forEach((tree, t) => {
      for (let k = 0; k < leaves; k++) {
        index[t * leaves + k] = layout.leafOffset[f] + t * leaves + k;
        weight[t * leaves + k] = tree.leafValue[k];
      }
    });
    heads.push({ outcome, bias: forest.baseLogit, index, weight, negativeKeepRate: 1 });
  }
  return heads;
}
