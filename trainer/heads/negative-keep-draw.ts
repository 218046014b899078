import { murmur3Finalize } from "../../scorer/murmur3.js";

/**
 * The uniform 32-bit draw that decides whether a negative row trains a head when
 * negatives are downsampled: keep when `draw < rate * 2^32`. It is a hash of the
 * global row number (rows seen before this one, over every run of the state), the
 * head index and the seed, not a stateful random stream, so a run resumed from a
 * saved state makes exactly the choices an uninterrupted run would, and two heads
 * keep independent subsets.
 *
 * @example
 * const keep = label === 1 || negativeKeepDraw(rowNumber, head, seed) < rate * 4294967296;
 */
export function negativeKeepDraw(row: number, head: number, seed: number): number {
  // MurmurHash3's 32-bit finalizer (Appleby) mixes each word in turn; `>>> 0`
  // takes the low 32 bits of the row number exactly for any integer below 2^53.
  let h = murmur3Finalize((seed ^ Math.imul(head + 1, 0x9e3779b1)) >>> 0);
  h = murmur3Finalize((h ^ row) >>> 0);
  h = murmur3Finalize((h ^ Math.floor(row / 4294967296)) >>> 0);
  return h;
}
