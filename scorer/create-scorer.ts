import type { ScoringModel } from "./model-types.js";
import { Scorer } from "./scorer.js";

/**
 * Builds a scorer from an in-memory model (the trainer's forests and heads), after
 * the same semantic checks an artifact gets; throws a ScorerError naming every
 * problem.
 *
 * @example
 * const scorer = createScorer({ contract, forests, encoding, heads, valueWeights: [1, 1, 2, 3, 4, -8] });
 * scorer.scoreOne({ tie_strength: 0.4 }).combined;
 */
export function createScorer(model: ScoringModel): Scorer {
  return new Scorer(model);
}
