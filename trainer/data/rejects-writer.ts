import { open, rename, unlink, type FileHandle } from "node:fs/promises";
import { dirname } from "node:path";
import { removeStaleTemps } from "../io/remove-stale-temps.js";
import { syncDirectory } from "../io/sync-directory.js";
import { tempPathFor } from "../io/temp-path-for.js";
import type { RejectRecord } from "./read-types.js";

/**
 * Streams rejected rows to a temporary sibling of the target and renames it
 * into place at the end (after fsync), so the rejects file is either complete
 * or absent, and a read with many bad rows never holds them all in memory.
 *
 * @example
 * const writer = await RejectsWriter.open("runs/demo/rejects.ndjson");
 * await writer.write([{ file: "plots.csv", row: 17, column: "tie_strength", code: "not_a_number", reason: "...", raw: "..." }]);
 * await writer.commit();
 */
export class RejectsWriter {
  private constructor(
    readonly path: string,
    private readonly tmp: string,
    private readonly handle: FileHandle,
  ) {}

  static async open(path: string): Promise<RejectsWriter> {
    const tmp = tempPathFor(path);
    return new RejectsWriter(path, tmp, await open(tmp, "wx"));
  }

  async write(records: readonly RejectRecord[]): Promise<void> {
    if (records.length === 0) return;
    let text = "";
    for (const record of records) text += JSON.stringify(record) + "\n";
    await this.handle.write(text);
  }

  /**
   * Flushes, closes and renames the file into place (on failure the temporary
   * file is removed), then removes temporary files killed writers left.
   */
  async commit(): Promise<void> {
    try {
      try {
        await this.handle.sync();
      } finally {
        await this.handle.close();
      }
      await rename(this.tmp, this.path);
    } catch (error) {
      await unlink(this.tmp).catch(() => undefined);
      throw error;
    }
    await syncDirectory(dirname(this.path));
    await removeStaleTemps(this.path);
  }

  /** Closes and removes the temporary file; the target is left as it was. */
  async discard(): Promise<void> {
    await this.handle.close().catch(() => undefined);
    await unlink(this.tmp).catch(() => undefined);
  }
}
