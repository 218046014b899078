import { LeafcastError } from "../errors.js";
import type { ForestCheckpointInputs } from "./forest-checkpoint.js";

/**
 * Refuses (LeafcastError from "checkpoint") a tree checkpoint made under
 * another schema, other settings or from another sample, naming which; the
 * files were compared before reading (checkInputFiles).
 *
 * @example
 * checkForestCheckpointInputs(saved.inputs, inputs, "forests.json.checkpoint");
 */
export function checkForestCheckpointInputs(
  saved: ForestCheckpointInputs,
  found: ForestCheckpointInputs,
  file: string,
): void {
  const parts = [
    ["schema", "the dataset schema"],
    ["settings", "the seed or tree settings"],
    ["sample", "the rows sampled from the files"],
  ] as const;
  const issues = parts
    .filter(([key]) => saved[key] !== found[key])
    .map(([key, what]) => ({
      code: `${key}_changed`,
      message: `cannot resume: ${what} expected ${saved[key]} (as when the checkpoint was made), found ${found[key]}; remove the checkpoint (or pass --restart) to start over`,
      file,
    }));
  if (issues.length > 0) throw new LeafcastError("checkpoint", issues);
}
