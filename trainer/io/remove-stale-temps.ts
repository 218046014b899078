import { readdir, unlink } from "node:fs/promises";
import { basename, dirname, join } from "node:path";

/**
 * Removes the temporary siblings of `path` (named as tempPathFor names them)
 * that processes which no longer run left behind, e.g. when killed mid-write.
 * Temporary files of this process and of live processes are left alone: they
 * may be writes in progress. Never throws: cleaning up is a courtesy, not part
 * of the write. Process ids are those of this host: on a folder that several
 * machines write (a network file system), another host's write in progress can
 * look stale; its rename then fails with a clear error, and no file is damaged.
 *
 * @example
 * await removeStaleTemps("runs/demo/forests.json"); // 2 when two killed runs left one each
 */
export async function removeStaleTemps(path: string): Promise<number> {
  const dir = dirname(path);
  const prefix = `.${basename(path)}.`;
  let names: string[];
  try {
    names = await readdir(dir);
  } catch {
    return 0;
  }
  let removed = 0;
  for (const name of names) {
    if (!name.startsWith(prefix) || !name.endsWith(".tmp")) continue;
    const match = /^(\d+)\.\d{12,}(?:\.\d+)?\.tmp$/.exec(name.slice(prefix.length));
    if (match === null) continue;
    const pid = Number(match[1]);
    if (pid === process.pid || isRunning(pid)) continue;
    try {
      await unlink(join(dir, name));
      removed++;
    } catch {
      // Another process cleaned it first, or it cannot be removed: leave it.
    }
  }
  return removed;
}

/** Whether a process with this id exists (signal 0 only checks). */
function isRunning(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    // EPERM: it exists but belongs to someone else.
    return (error as NodeJS.ErrnoException).code === "EPERM";
  }
}
