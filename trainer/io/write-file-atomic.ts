import { open, rename, unlink } from "node:fs/promises";
import { dirname, basename, join } from "node:path";

/**
 * Writes a file so that a reader (or a kill at any moment) sees either the old
 * file or the complete new one, never a torn write: write a temporary sibling,
 * flush it to disk, rename it over the target, then flush the directory.
 *
 * @example
 * await writeFileAtomic("runs/demo/trees.json", JSON.stringify(forests));
 */
export async function writeFileAtomic(path: string, data: string | Uint8Array): Promise<void> {
  const tmp = join(dirname(path), `.${basename(path)}.${process.pid}.${Date.now()}.tmp`);
  const handle = await open(tmp, "w");
  try {
    await handle.writeFile(data);
    await handle.sync();
  } catch (error) {
    await handle.close();
    await unlink(tmp).catch(() => undefined);
    throw error;
  }
  await handle.close();
  await rename(tmp, path);
  await syncDirectory(dirname(path));
}

async function syncDirectory(dir: string): Promise<void> {
  try {
    const handle = await open(dir, "r");
    try {
      await handle.sync();
    } finally {
      await handle.close();
    }
  } catch {
    // Some file systems refuse fsync on a directory; the rename is still atomic there.
  }
}
