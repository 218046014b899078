import { createScorer } from "../../scorer/create-scorer.js";
import type { Scorer } from "../../scorer/scorer.js";
import { exportHeadModels } from "../heads/export-head-models.js";
import type { HeadState } from "../heads/head-state.js";
import type { ForestFile } from "../trees/forest-file.js";

/**
 * A scorer of the heads as they stand now over their trees, scoring exactly as an
 * exported artifact would. The weights are copied out, so later updates of `state`
 * do not reach it: build it before the heads learn on.
 *
 * @example
 * const frozen = hybridScorer(forests, state);
 * frozen.scoreBatch(batch).probability.open;
 */
export function hybridScorer(forestFile: ForestFile, state: HeadState): Scorer {
  const heads = exportHeadModels(state);
  return createScorer({
    contract: forestFile.contract,
    forests: forestFile.forests.map((f) => f.forest),
    encoding: state.info.encoding,
    heads,
    valueWeights: heads.map(() => 1),
  });
}
