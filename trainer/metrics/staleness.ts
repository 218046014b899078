import { LeafcastError } from "../errors.js";
import { psiReading, type PsiReading } from "./psi-reading.js";

/** Whether the trees should be refit, and why. */
export interface StalenessVerdict {
  readonly refit: boolean;
  readonly threshold: number;
  /** Forests at or above the threshold, worst first. */
  readonly staleForests: readonly string[];
  /** The forest with the largest PSI. */
  readonly worst: { readonly forest: string; readonly psi: number; readonly reading: PsiReading };
  /** One sentence for people: the verdict, the figures behind it, and what to do. */
  readonly reason: string;
}

/**
 * Recommends refitting the trees when any forest's leaf PSI (LeafPsi.forest, keyed by
 * forest name) reaches `threshold`. The default 0.25 is where the usual reading starts
 * calling a shift significant; a lower threshold such as 0.10 refits earlier.
 * Head updates re-weight leaves but cannot split a population the trees no longer
 * separate, which is why a leaf-share shift calls for a refit rather than more head
 * training.
 *
 * @example
 * staleness({ open: 0.04, reply: 0.31 }, 0.25).reason;
 * // 'refit the trees: forest "reply" has leaf PSI 0.310 (significant shift), at or above the threshold 0.25'
 */
export function staleness(
  psiPerForest: Readonly<Record<string, number>>,
  threshold = 0.25,
): StalenessVerdict {
  const entries = Object.entries(psiPerForest);
  const problems: string[] = [];
  if (entries.length === 0) problems.push("expected PSI for at least one forest, found none");
  if (!(threshold > 0 && threshold < Infinity)) {
    problems.push(`threshold expected a positive number, found ${threshold}`);
  }
  for (const [forest, psi] of entries) {
    if (!(psi >= 0 && psi < Infinity)) {
      problems.push(`forest "${forest}" PSI expected a finite number >= 0, found ${psi}`);
    }
  }
  if (problems.length > 0) {
    throw new LeafcastError(
      "metrics",
      problems.map((p) => ({ code: "staleness_input", message: `staleness: ${p}` })),
    );
  }

  entries.sort((a, b) => b[1] - a[1]);
  const [worstForest, worstPsi] = entries[0];
  const worst = { forest: worstForest, psi: worstPsi, reading: psiReading(worstPsi) };
  const stale = entries.filter(([, psi]) => psi >= threshold).map(([forest]) => forest);
  const figure = `leaf PSI ${worstPsi.toFixed(3)} (${describe(worst.reading)})`;
  let reason: string;
  if (stale.length === 0) {
    reason = `keep the trees: the largest ${figure}, in forest "${worstForest}", is below the threshold ${threshold}`;
  } else if (stale.length === 1) {
    reason = `refit the trees: forest "${worstForest}" has ${figure}, at or above the threshold ${threshold}`;
  } else {
    const names = stale.map((f) => `"${f}"`).join(", ");
    reason = `refit the trees: forests ${names} are at or above the threshold ${threshold}; the worst, "${worstForest}", has ${figure}`;
  }
  return { refit: stale.length > 0, threshold, staleForests: stale, worst, reason };
}

function describe(reading: PsiReading): string {
  return reading === "stable" ? "stable" : `${reading} shift`;
}
