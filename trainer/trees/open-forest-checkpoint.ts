import { checkInputFiles, type InputFileIdentity } from "../io/input-file-identity.js";
import { readCheckpointBytes } from "../io/read-checkpoint-bytes.js";
import { decodeForestCheckpoint } from "./decode-forest-checkpoint.js";
import type { ForestCheckpoint } from "./forest-checkpoint.js";

/**
 * The tree checkpoint at `path` when there is one (null: start afresh), refused
 * at once when it was made from other files: that needs no reading of the data,
 * while the rest of the match (schema, settings, sample) is checked once the
 * sample is drawn (checkForestCheckpointInputs).
 *
 * @example
 * const saved = await openForestCheckpoint("forests.json.checkpoint", await inputFileIdentities(paths));
 */
export async function openForestCheckpoint(
  path: string,
  files: readonly InputFileIdentity[],
): Promise<ForestCheckpoint | null> {
  const bytes = await readCheckpointBytes(path);
  if (bytes === null) return null;
  const saved = decodeForestCheckpoint(new TextDecoder().decode(bytes), path);
  checkInputFiles(saved.inputs.files, files, path);
  return saved;
}
