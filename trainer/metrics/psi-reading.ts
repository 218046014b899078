/** The usual three-way reading of a PSI value. */
export type PsiReading = "stable" | "moderate" | "significant";

/**
 * Reads a PSI value the usual way: below 0.10 stable, 0.10 to 0.25 moderate shift,
 * above 0.25 significant shift (Yurdakul 2018 traces these thresholds to
 * credit-scoring practice). The boundaries themselves read as moderate.
 *
 * @example
 * psiReading(0.04); // "stable"
 * psiReading(0.3); // "significant"
 */
export function psiReading(psi: number): PsiReading {
  if (Number.isNaN(psi)) throw new RangeError("psiReading: expected a number, found NaN");
  if (psi < 0.1) return "stable";
  if (psi <= 0.25) return "moderate";
  return "significant";
}
