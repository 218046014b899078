import { LeafcastError } from "../errors.js";

/**
 * Normalized entropy divides by H(trainingRate), which is zero at 0 and 1: the rate
 * must lie strictly between them. Throws a LeafcastError (code "training_rate").
 *
 * @example
 * checkTrainingRate("normalizedEntropy", 0.04); // passes
 * checkTrainingRate("normalizedEntropy", 0); // throws
 */
export function checkTrainingRate(op: string, trainingRate: number): void {
  if (!(trainingRate > 0 && trainingRate < 1)) {
    throw new LeafcastError("metrics", [
      {
        code: "training_rate",
        message: `${op}: training positive rate expected a number strictly between 0 and 1, found ${trainingRate}`,
      },
    ]);
  }
}
