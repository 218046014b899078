// What generation g of each target of atomic-writer-child.mjs holds, so the
// test can tell a complete file of some generation from a torn one.
import { TextEncoder } from "node:util";

/** Rows of the CSV and records of the rejects file per generation. */
export const CSV_ROWS = 100_000;
export const REJECT_ROWS = 20_000;

/** Generation g of blob.bin: a header naming g, 2 MB of bytes drawn from g, an end mark. */
export function blobOf(g) {
  const size = 2 * 1024 * 1024;
  const head = new TextEncoder().encode(`generation ${g}\n`);
  const tail = new TextEncoder().encode(`end ${g}\n`);
  const bytes = new Uint8Array(head.length + size + tail.length);
  bytes.set(head, 0);
  let x = (g * 2654435761) >>> 0 || 1;
  for (let i = 0; i < size; i++) {
    x ^= x << 13;
    x ^= x >>> 17;
    x ^= x << 5;
    bytes[head.length + i] = x & 0xff;
  }
  bytes.set(tail, head.length + size);
  return bytes;
}
