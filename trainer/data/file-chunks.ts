import { open, type FileHandle } from "node:fs/promises";

/**
 * A sliding window over a file for the text readers: bytes `buf[start, end)`
 * are read but not yet consumed. `more()` moves them to the front of one reused
 * buffer and reads the next chunk after them, so a record cut by a chunk
 * boundary is completed without copying whole chunks, and the buffer only grows
 * when a single record is longer than it.
 *
 * @example
 * const chunks = await FileChunks.open("plots.csv", 1 << 20);
 * while (await chunks.more()) chunks.start = consume(chunks.buf, chunks.start, chunks.end);
 * await chunks.close();
 */
export class FileChunks {
  buf: Buffer;
  start = 0;
  end = 0;
  /** True once the last byte of the file is in the window. */
  eof = false;

  private constructor(
    private readonly handle: FileHandle,
    private readonly chunkBytes: number,
  ) {
    this.buf = Buffer.allocUnsafe(chunkBytes);
  }

  static async open(path: string, chunkBytes: number): Promise<FileChunks> {
    return new FileChunks(await open(path, "r"), chunkBytes);
  }

  /** Reads the next chunk; false when the file was already at its end. */
  async more(): Promise<boolean> {
    if (this.eof) return false;
    const kept = this.end - this.start;
    if (this.start > 0) {
      this.buf.copyWithin(0, this.start, this.end);
      this.start = 0;
      this.end = kept;
    }
    if (kept === this.buf.length) {
      const grown = Buffer.allocUnsafe(this.buf.length * 2);
      this.buf.copy(grown, 0, 0, kept);
      this.buf = grown;
    }
    const room = Math.min(this.chunkBytes, this.buf.length - kept);
    const { bytesRead } = await this.handle.read(this.buf, kept, room, null);
    this.end = kept + bytesRead;
    if (bytesRead === 0) this.eof = true;
    return true;
  }

  async close(): Promise<void> {
    await this.handle.close();
  }
}
