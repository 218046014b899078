/**
 * A straightforward byte-at-a-time port of MurmurHash3_x86_32 (Appleby's
 * public-domain reference, MurmurHash3.cpp), over a Uint8Array, written for the
 * tests as an independent check of scorer/murmur3.ts (which encodes UTF-8 on the
 * fly and hashes string pieces).
 */
export function murmur3Bytes(bytes: Uint8Array, seed: number): number {
  const c1 = 0xcc9e2d51;
  const c2 = 0x1b873593;
  let h1 = seed >>> 0;
  const blocks = bytes.length >> 2;
  for (let i = 0; i < blocks; i++) {
    let k1 =
      bytes[4 * i] | (bytes[4 * i + 1] << 8) | (bytes[4 * i + 2] << 16) | (bytes[4 * i + 3] << 24);
    k1 = Math.imul(k1, c1);
    k1 = (k1 << 15) | (k1 >>> 17);
    k1 = Math.imul(k1, c2);
    h1 ^= k1;
    h1 = (h1 << 13) | (h1 >>> 19);
    h1 = (Math.imul(h1, 5) + 0xe6546b64) | 0;
  }
  const tail = blocks * 4;
  const rest = bytes.length & 3;
  if (rest > 0) {
    let k1 = 0;
    if (rest === 3) k1 ^= bytes[tail + 2] << 16;
    if (rest >= 2) k1 ^= bytes[tail + 1] << 8;
    k1 ^= bytes[tail];
    k1 = Math.imul(k1, c1);
    k1 = (k1 << 15) | (k1 >>> 17);
    k1 = Math.imul(k1, c2);
    h1 ^= k1;
  }
  h1 ^= bytes.length;
  h1 ^= h1 >>> 16;
  h1 = Math.imul(h1, 0x85ebca6b);
  h1 ^= h1 >>> 13;
  h1 = Math.imul(h1, 0xc2b2ae35);
  h1 ^= h1 >>> 16;
  return h1 >>> 0;
}

/** The same over the UTF-8 bytes of a text (TextEncoder, independent of the scorer's encoder). */
export function murmur3Text(text: string, seed: number): number {
  return murmur3Bytes(new TextEncoder().encode(text), seed);
}
