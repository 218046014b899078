import type { ForestFile } from "./forest-file.js";

/** What one forest of a fitting run amounts to. */
export interface ForestSummary {
  readonly outcome: string;
  readonly trees: number;
  readonly startLoss: number;
  readonly trainLoss: number;
  readonly validationLoss: number | null;
  readonly topFeatures: readonly string[];
}

/**
 * Per forest: trees kept, losses and the five features that earned the most gain.
 *
 * @example
 * summarizeForests(file)[0].topFeatures; // ["tie_strength", ...]
 */
export function summarizeForests(file: ForestFile): ForestSummary[] {
  return file.forests.map((f) => {
    const kept = f.forest.trees.length;
    return {
      outcome: f.forest.outcome,
      trees: kept,
      startLoss: f.startTrainLoss,
      trainLoss: kept > 0 ? f.trainLoss[kept - 1] : f.startTrainLoss,
      validationLoss:
        f.validationLoss === null
          ? null
          : kept > 0
            ? f.validationLoss[kept - 1]
            : f.startValidationLoss,
      topFeatures: [...f.importance]
        .filter((i) => i.splits > 0)
        .sort((a, b) => b.gain - a.gain)
        .slice(0, 5)
        .map((i) => i.feature),
    };
  });
}
