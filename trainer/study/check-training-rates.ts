import { LeafcastError } from "../errors.js";

/**
 * NE divides by H(training rate), which is 0 for an outcome never (or always)
 * positive in the fit span: such outcomes are refused, all named at once.
 *
 * @example
 * checkTrainingRates(new Map([["hide", 0]]), "days 1-7");
 * // throws: study: outcome "hide" expected both positive and negative rows in the fit span (days 1-7), ...
 */
export function checkTrainingRates(rates: ReadonlyMap<string, number>, fitLabel: string): void {
  const bad = [...rates].filter(([, rate]) => !(rate > 0 && rate < 1));
  if (bad.length > 0)
    throw new LeafcastError(
      "study",
      bad.map(([outcome, rate]) => ({
        code: "training_rate",
        message: `outcome "${outcome}" expected both positive and negative rows in the fit span (${fitLabel}), found a positive rate of ${rate}; leave it out with heads.outcomes`,
      })),
    );
}
