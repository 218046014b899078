import { writeStreamAtomic } from "./write-stream-atomic.js";

/**
 * Writes a file so that a reader (or a kill at any moment) sees either the old
 * file or the complete new one, never a torn write: write a temporary sibling
 * (tempPathFor; created exclusively, so two writes never share one), flush it
 * to disk, rename it over the target, then flush the directory. On any failure
 * the temporary file is removed and the target is left as it was. After a
 * successful write, temporary siblings that killed processes left are removed.
 *
 * @example
 * await writeFileAtomic("runs/demo/trees.json", JSON.stringify(forests));
 */
export async function writeFileAtomic(path: string, data: string | Uint8Array): Promise<void> {
  const bytes = typeof data === "string" ? new TextEncoder().encode(data) : data;
  await writeStreamAtomic(path, (sink) => sink.write(bytes));
}
