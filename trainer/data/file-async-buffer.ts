import { open, type FileHandle } from "node:fs/promises";
import type { AsyncBuffer } from "hyparquet";

/** An AsyncBuffer over an open file, with the handle to close when done. */
export interface FileAsyncBuffer {
  readonly buffer: AsyncBuffer;
  close(): Promise<void>;
}

/**
 * Opens a file as the random-access buffer hyparquet reads from: each slice is
 * read from disk when asked for, so only the footer and the row group being
 * decoded are ever in memory, never the whole file.
 *
 * @example
 * const file = await openFileAsyncBuffer("impressions.parquet");
 * try { const metadata = await parquetMetadataAsync(file.buffer); } finally { await file.close(); }
 */
export async function openFileAsyncBuffer(path: string): Promise<FileAsyncBuffer> {
  const handle = await open(path, "r");
  let size: number;
  try {
    size = (await handle.stat()).size;
  } catch (error) {
    await handle.close();
    throw error;
  }
  return {
    buffer: {
      byteLength: size,
      slice: (start: number, end?: number) => readSlice(handle, size, start, end ?? size),
    },
    close: () => handle.close(),
  };
}

async function readSlice(
  handle: FileHandle,
  size: number,
  start: number,
  end: number,
): Promise<ArrayBuffer> {
  const from = Math.max(0, Math.min(start, size));
  const to = Math.max(from, Math.min(end, size));
  const bytes = new Uint8Array(to - from);
  let filled = 0;
  while (filled < bytes.length) {
    const { bytesRead } = await handle.read(bytes, filled, bytes.length - filled, from + filled);
    if (bytesRead === 0) break; // the file shrank under us; the parser reports the short read
    filled += bytesRead;
  }
  return filled === bytes.length ? bytes.buffer : bytes.buffer.slice(0, filled);
}
