import { unlink } from "node:fs/promises";
import { dirname } from "node:path";
import { removeStaleTemps } from "./remove-stale-temps.js";
import { syncDirectory } from "./sync-directory.js";

/**
 * Removes a file (a checkpoint once its run has finished); a file that is not
 * there is fine. The directory is flushed so the removal outlives a crash, and
 * temporary files that killed writers of this path left behind go too.
 *
 * @example
 * await removeFileIfPresent("runs/demo/forests.json.checkpoint");
 */
export async function removeFileIfPresent(path: string): Promise<void> {
  await removeStaleTemps(path);
  try {
    await unlink(path);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === "ENOENT") return;
    throw error;
  }
  await syncDirectory(dirname(path));
}
