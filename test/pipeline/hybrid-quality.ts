import { createScorer } from "../../scorer/create-scorer.js";
import type { ScoringModel } from "../../scorer/model-types.js";
import { CategoryDictionary } from "../../trainer/data/category-dictionary.js";
import { labelColumn, numberColumn } from "../../trainer/data/column-batch.js";
import { openDataFile } from "../../trainer/data/open-data-file.js";
import { exportHeadModels } from "../../trainer/heads/export-head-models.js";
import type { HeadState } from "../../trainer/heads/head-state.js";
import { calibration, normalizedEntropy } from "../../trainer/metrics/index.js";
import type { ResolvedSchema } from "../../trainer/schema/load-dataset-schema.js";
import type { ForestFile } from "../../trainer/trees/forest-file.js";
import { forestHeadModels } from "../../trainer/study/forest-head-models.js";

/** Held-out figures of one outcome. */
export interface HeldOutFigures {
  readonly outcome: string;
  /** NE of the served hybrid (trees + head), of the outcome's forest alone, and of the generator's true probability. */
  readonly hybridNe: number;
  readonly treesNe: number;
  readonly trueNe: number;
  readonly calibration: number;
  /** Calibration of the forest alone. */
  readonly treesCalibration: number;
  /** Calibration of the generator's true probabilities on the same rows: how far label noise alone moves the observed rate. */
  readonly trueCalibration: number;
}

/**
 * Scores held-out files through the scorer's own path (a ScoringModel of the
 * forests, the exported heads and the state's encoding, scored with
 * createScorer(...).scoreBatch), and the forest of each outcome alone through
 * a second ScoringModel whose head for an outcome is that outcome's forest
 * (bias = base log-odds, weight = leaf value on the forest's leaf slots); NE of each against `trainingRate` (the positive rate of the
 * training rows), as He et al. (2014) define it.
 */
export async function heldOutFigures(
  paths: readonly string[],
  schema: ResolvedSchema,
  forestFile: ForestFile,
  state: HeadState,
  trainingRate: ReadonlyMap<string, number>,
): Promise<HeldOutFigures[]> {
  const forests = forestFile.forests.map((f) => f.forest);
  const heads = exportHeadModels(state);
  const model: ScoringModel = {
    contract: forestFile.contract,
    forests,
    encoding: state.info.encoding,
    heads,
    valueWeights: heads.map(() => 1),
  };
  const scorer = createScorer(model);
  const outcomes = state.info.outcomes;
  const forestHeads = forestHeadModels(forests, model.encoding, outcomes);
  if (forestHeads.length !== outcomes.length) throw new Error("test: every outcome needs a forest");
  const treesOnly = createScorer({ ...model, heads: forestHeads });
  const hybrid: number[][] = outcomes.map(() => []);
  const trees: number[][] = outcomes.map(() => []);
  const truth: number[][] = outcomes.map(() => []);
  const labels: number[][] = outcomes.map(() => []);
  const dictionaries = new Map<string, CategoryDictionary>();
  for (const path of paths) {
    for await (const batch of openDataFile(path, schema, { dictionaries }).batches()) {
      const scores = scorer.scoreBatch(batch);
      const treeScores = treesOnly.scoreBatch(batch);
      outcomes.forEach((outcome, h) => {
        const q = scores.probability[outcome];
        const t = treeScores.probability[outcome];
        const y = labelColumn(batch, outcome);
        const p = numberColumn(batch, schema.trueProbability.get(outcome) ?? "");
        for (let r = 0; r < batch.rowCount; r++) {
          hybrid[h].push(q[r]);
          trees[h].push(t[r]);
          truth[h].push(p[r]);
          labels[h].push(y[r]);
        }
      });
    }
  }
  return outcomes.map((outcome, h) => {
    const y = Uint8Array.from(labels[h]);
    const rate = trainingRate.get(outcome) ?? NaN;
    const q = Float64Array.from(hybrid[h]);
    const p = Float64Array.from(truth[h]);
    return {
      outcome,
      hybridNe: normalizedEntropy(q, y, rate),
      treesNe: normalizedEntropy(Float64Array.from(trees[h]), y, rate),
      treesCalibration: calibration(Float64Array.from(trees[h]), y),
      trueNe: normalizedEntropy(p, y, rate),
      trueCalibration: calibration(p, y),
      calibration: calibration(q, y),
    };
  });
}
