import { LeafcastError } from "../errors.js";

/**
 * The error for a checkpoint that is not a whole one of its kind (code
 * "damaged_checkpoint"), telling the user how to start over.
 *
 * @example
 * throw damagedCheckpointError("expected a JSON tree-fitting checkpoint, found text that does not parse", path);
 */
export function damagedCheckpointError(message: string, file?: string): LeafcastError {
  return new LeafcastError("checkpoint", [
    {
      code: "damaged_checkpoint",
      message: `${message}; remove the checkpoint (or pass --restart) to start over`,
      ...(file === undefined ? {} : { file }),
    },
  ]);
}
