import { open, rename, unlink } from "node:fs/promises";
import { dirname } from "node:path";
import { removeStaleTemps } from "./remove-stale-temps.js";
import { syncDirectory } from "./sync-directory.js";
import { tempPathFor } from "./temp-path-for.js";

/** Where a streaming writer sends its bytes. */
export interface ByteSink {
  /** Appends `bytes`; the caller may reuse the array once the promise settles. */
  write(bytes: Uint8Array): Promise<void>;
  /** Bytes appended so far. */
  readonly bytesWritten: number;
}

/**
 * Writes a file as a stream, atomically (writeFileAtomic is the one-buffer case): `produce` appends
 * bytes to a temporary sibling of `path`; when it resolves, the file is flushed
 * to disk and renamed over `path` (then the directory is flushed), so a reader,
 * or a kill at any moment, sees either the old file or the whole new one. When
 * `produce` throws, the temporary file is removed and the error passes on;
 * after a successful write, temporary files that killed writers of `path` left
 * behind are removed (see removeStaleTemps). Returns the number of bytes written.
 *
 * @example
 * await writeStreamAtomic("runs/log.csv", async (sink) => {
 *   await sink.write(new TextEncoder().encode("a,b\n1,2\n"));
 * });
 */
export async function writeStreamAtomic(
  path: string,
  produce: (sink: ByteSink) => Promise<void>,
): Promise<number> {
  const tmp = tempPathFor(path);
  const handle = await open(tmp, "wx");
  let bytesWritten = 0;
  const sink: ByteSink = {
    async write(bytes: Uint8Array): Promise<void> {
      let done = 0;
      // A single write may be partial (large buffers, some file systems): loop.
      while (done < bytes.byteLength) {
        const { bytesWritten: n } = await handle.write(bytes, done, bytes.byteLength - done);
        done += n;
      }
      bytesWritten += bytes.byteLength;
    },
    get bytesWritten(): number {
      return bytesWritten;
    },
  };
  try {
    try {
      await produce(sink);
      await handle.sync();
    } finally {
      await handle.close();
    }
    await rename(tmp, path);
  } catch (error) {
    await unlink(tmp).catch(() => undefined);
    throw error;
  }
  await syncDirectory(dirname(path));
  await removeStaleTemps(path);
  return bytesWritten;
}
