/**
 * MurmurHash3, x86 32-bit variant (Appleby's public-domain algorithm), over the
 * UTF-8 bytes of a text. The text is encoded on the fly, so hashing allocates
 * nothing: the row encoder hashes every categorical value of every row.
 *
 * Lone UTF-16 surrogates are encoded as U+FFFD, as TextEncoder does.
 *
 * @example
 * murmur3("hello", 0); // 0x248bfa47
 * murmur3Parts(["crop=", "kale"], 2, 0) === murmur3("crop=kale", 0); // true
 */
export function murmur3(key: string, seed: number): number {
  single[0] = key;
  return murmur3Parts(single, 1, seed);
}

const single: string[] = [""];

/**
 * The hash of the concatenation of `parts[0 .. count)`, without building the
 * concatenated text (the hashed-feature keys are prefix + value pieces).
 * A surrogate pair split across two parts is read as two lone surrogates.
 */
export function murmur3Parts(parts: readonly string[], count: number, seed: number): number {
  let h = seed | 0;
  let k = 0; // pending bytes, little-endian
  let pending = 0;
  let length = 0;
  for (let p = 0; p < count; p++) {
    const text = parts[p];
    const end = text.length;
    for (let i = 0; i < end; i++) {
      let c = text.charCodeAt(i);
      let bytes: number;
      let byteCount: number;
      if (c < 0x80) {
        bytes = c;
        byteCount = 1;
      } else if (c < 0x800) {
        bytes = 0xc0 | (c >> 6) | ((0x80 | (c & 63)) << 8);
        byteCount = 2;
      } else {
        if (c >= 0xd800 && c <= 0xdfff) {
          const d = i + 1 < end ? text.charCodeAt(i + 1) : 0;
          if (c <= 0xdbff && d >= 0xdc00 && d <= 0xdfff) {
            c = 0x10000 + ((c - 0xd800) << 10) + (d - 0xdc00);
            i++;
          } else {
            c = 0xfffd;
          }
        }
        if (c < 0x10000) {
          bytes = 0xe0 | (c >> 12) | ((0x80 | ((c >> 6) & 63)) << 8) | ((0x80 | (c & 63)) << 16);
          byteCount = 3;
        } else {
          bytes =
            0xf0 |
            (c >> 18) |
            ((0x80 | ((c >> 12) & 63)) << 8) |
            ((0x80 | ((c >> 6) & 63)) << 16) |
            ((0x80 | (c & 63)) << 24);
          byteCount = 4;
        }
      }
      length += byteCount;
      for (let b = 0; b < byteCount; b++) {
        k |= ((bytes >>> (8 * b)) & 0xff) << (8 * pending);
        if (++pending === 4) {
          h = mixBlock(h, k);
          k = 0;
          pending = 0;
        }
      }
    }
  }
  if (pending > 0) h ^= scrambleBlock(k);
  return murmur3Finalize(h ^ length);
}

/**
 * MurmurHash3's 32-bit finalizer (fmix32, Appleby): mixes every input bit into
 * every output bit; the unsigned result.
 *
 * @example
 * murmur3Finalize(0); // 0
 */
export function murmur3Finalize(x: number): number {
  let h = x;
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 0;
}

function scrambleBlock(k: number): number {
  k = Math.imul(k, 0xcc9e2d51);
  k = (k << 15) | (k >>> 17);
  return Math.imul(k, 0x1b873593);
}

function mixBlock(h: number, k: number): number {
  h ^= scrambleBlock(k);
  h = (h << 13) | (h >>> 19);
  return (Math.imul(h, 5) + 0xe6546b64) | 0;
}
