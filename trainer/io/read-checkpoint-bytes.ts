import { readFile } from "node:fs/promises";
import { LeafcastError } from "../errors.js";

/**
 * The bytes of a checkpoint file, or null when there is none (a fresh run).
 *
 * @example
 * const bytes = await readCheckpointBytes("runs/demo/forests.json.checkpoint"); // null: start afresh
 */
export async function readCheckpointBytes(path: string): Promise<Uint8Array | null> {
  try {
    return await readFile(path);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === "ENOENT") return null;
    const reason = error instanceof Error ? error.message : String(error);
    throw new LeafcastError("checkpoint", [
      { code: "unreadable", message: `cannot read the checkpoint: ${reason}`, file: path },
    ]);
  }
}
