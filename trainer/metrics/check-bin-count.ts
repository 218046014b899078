import { LeafcastError } from "../errors.js";

/**
 * A bin count must be a whole number >= 1. Throws a LeafcastError (code "bin_count").
 *
 * @example
 * checkBinCount("reliabilityBins", 10); // passes
 * checkBinCount("reliabilityBins", 2.5); // throws
 */
export function checkBinCount(op: string, binCount: number): void {
  if (!(Number.isInteger(binCount) && binCount >= 1)) {
    throw new LeafcastError("metrics", [
      {
        code: "bin_count",
        message: `${op}: bin count expected a whole number >= 1, found ${binCount}`,
      },
    ]);
  }
}
