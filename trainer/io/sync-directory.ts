import { open } from "node:fs/promises";

/**
 * Flushes a directory's entries to disk, so that a rename into it survives a
 * power cut, not just a killed process. Errors are ignored: some file systems
 * refuse fsync on a directory, and the rename is atomic there all the same.
 *
 * @example
 * await rename(tmp, "runs/demo/heads.state");
 * await syncDirectory("runs/demo");
 */
export async function syncDirectory(dir: string): Promise<void> {
  try {
    const handle = await open(dir, "r");
    try {
      await handle.sync();
    } finally {
      await handle.close();
    }
  } catch {
    // See above: the rename itself is still atomic.
  }
}
