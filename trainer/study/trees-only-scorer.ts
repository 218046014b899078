import { createScorer } from "../../scorer/create-scorer.js";
import type { Scorer } from "../../scorer/scorer.js";
import type { HeadState } from "../heads/head-state.js";
import type { ForestFile } from "../trees/forest-file.js";
import { forestHeadModels } from "./forest-head-models.js";

/**
 * A scorer of the "trees only" baseline: for every head outcome that has a forest,
 * the forest's own prediction (see forestHeadModels), read through the same
 * encoding as the heads. Null when no head outcome has a forest.
 *
 * @example
 * treesOnlyScorer(forests, state)?.scoreBatch(batch).probability.open;
 */
export function treesOnlyScorer(forestFile: ForestFile, state: HeadState): Scorer | null {
  const forests = forestFile.forests.map((f) => f.forest);
  const heads = forestHeadModels(forests, state.info.encoding, state.info.outcomes);
  if (heads.length === 0) return null;
  return createScorer({
    contract: forestFile.contract,
    forests,
    encoding: state.info.encoding,
    heads,
    valueWeights: heads.map(() => 1),
  });
}
