import { LeafcastError, type Issue } from "../errors.js";
import type { ResolvedSchema } from "../schema/load-dataset-schema.js";

/**
 * Checks pruneFeatures' options and throws one LeafcastError ("pruning") naming
 * every problem: dropPerStep a whole number >= 1 or a share in (0, 1),
 * minFeatures a whole number >= 1, neTolerance finite and >= 0, and every
 * protected name a feature column of the schema.
 *
 * @example
 * checkPruningOptions(schema, 2, 4, 0.002, ["tie_strength"]); // passes
 */
export function checkPruningOptions(
  schema: ResolvedSchema,
  dropPerStep: number,
  minFeatures: number,
  neTolerance: number,
  protect: readonly string[],
): void {
  const issues: Issue[] = [];
  if (!(dropPerStep > 0 && (dropPerStep < 1 || Number.isSafeInteger(dropPerStep)))) {
    issues.push({
      code: "drop_per_step",
      message: `dropPerStep expected a whole number >= 1 or a share in (0, 1), found ${dropPerStep}`,
    });
  }
  if (!(Number.isSafeInteger(minFeatures) && minFeatures >= 1)) {
    issues.push({
      code: "min_features",
      message: `minFeatures expected a whole number >= 1, found ${minFeatures}`,
    });
  }
  if (!(neTolerance >= 0 && Number.isFinite(neTolerance))) {
    issues.push({
      code: "ne_tolerance",
      message: `neTolerance expected a finite number >= 0, found ${neTolerance}`,
    });
  }
  for (const name of protect) {
    const role = schema.byName.get(name)?.role;
    if (role !== "numeric" && role !== "categorical") {
      issues.push({
        code: "unknown_column",
        message: `protect: expected "${name}" to be a feature column of schema "${schema.name}", found ${role === undefined ? "no such column" : `role "${role}"`}`,
      });
    }
  }
  if (issues.length > 0) throw new LeafcastError("pruning", issues);
}
