import { LeafcastError } from "../errors.js";
import type { ForestTarget } from "./fit-forests.js";
import type { ForestProgress } from "./forest-checkpoint.js";

/**
 * A checkpoint's forests, refused (LeafcastError from "checkpoint") unless they
 * are a beginning of the targets, every forest but the last complete.
 *
 * @example
 * const resume = checkCheckpointTargets(checkpoint.forests, targets);
 */
export function checkCheckpointTargets(
  resume: readonly ForestProgress[] | null,
  targets: readonly ForestTarget[],
): readonly ForestProgress[] {
  if (resume === null) return [];
  const fits =
    resume.length <= targets.length &&
    resume.every(
      (forest, f) =>
        forest.outcome === targets[f].outcome && (forest.complete || f === resume.length - 1),
    );
  if (!fits) {
    throw new LeafcastError("checkpoint", [
      {
        code: "outcomes_changed",
        message: `cannot resume: the checkpoint holds forests for ${resume.map((r) => r.outcome).join(", ")}, expected a beginning of ${targets.map((t) => t.outcome).join(", ")}; remove the checkpoint (or pass --restart) to start over`,
      },
    ]);
  }
  return resume;
}
