const TWO_POW_32 = 4294967296;
const INV_TWO_POW_32 = 1 / TWO_POW_32;
const INV_TWO_POW_53 = 1 / 2 ** 53;

/**
 * A fast seeded random source: xoshiro128** (Blackman & Vigna 2018), 32-bit
 * state words kept in an Int32Array, seeded through
 * splitmix32 from (seed, stream) so that separate streams of one seed are
 * unrelated. The generator draws each stage of a row from its own stream,
 * which keeps the output identical whatever the chunk size.
 *
 * @example
 * const rng = new RandomSource(42, 1);
 * rng.unit(); // a double in [0, 1)
 * rng.normal(); // a standard normal draw
 */
export class RandomSource {
  /** State words in a typed array: plain number fields would box values beyond 2^30. */
  private readonly s = new Int32Array(4);
  private spare = 0;
  private hasSpare = false;

  constructor(seed: number, stream: number) {
    // Mix both 32-bit halves of a safe-integer seed with the stream number.
    let x = (Math.floor(seed / TWO_POW_32) ^ Math.imul(stream + 1, 0x9e3779b9)) >>> 0;
    x = splitmix32(x ^ (seed >>> 0));
    const s = this.s;
    s[0] = x = splitmix32(x);
    s[1] = x = splitmix32(x);
    s[2] = x = splitmix32(x);
    s[3] = splitmix32(x);
    if ((s[0] | s[1] | s[2] | s[3]) === 0) s[0] = 1;
  }

  /** The next 32 random bits as an unsigned integer. */
  uint32(): number {
    const s = this.s;
    const s0 = s[0];
    const s1 = s[1];
    const s2 = s[2] ^ s0;
    const s3 = s[3] ^ s1;
    s[0] = s0 ^ s3;
    s[1] = s1 ^ s2;
    s[2] = s2 ^ (s1 << 9);
    s[3] = (s3 << 11) | (s3 >>> 21);
    return Math.imul(rotl(Math.imul(s1, 5), 7), 9) >>> 0;
  }

  /** A double in [0, 1) on a 2^-32 grid: enough for features. */
  unit(): number {
    return this.uint32() * INV_TWO_POW_32;
  }

  /**
   * Fills out[0, count) with uniforms in [0, 1) on the 2^-32 grid: the hot
   * path of the generator, which draws a fixed number per row in bulk (state in
   * locals, no call per draw, no boxed doubles) and then reads them back.
   */
  fillUnits(out: Float64Array, count: number): void {
    const s = this.s;
    let s0 = s[0];
    let s1 = s[1];
    let s2 = s[2];
    let s3 = s[3];
    for (let i = 0; i < count; i++) {
      const r = Math.imul(rotl(Math.imul(s1, 5), 7), 9) >>> 0;
      const t = s1 << 9;
      s2 ^= s0;
      s3 ^= s1;
      s1 ^= s2;
      s0 ^= s3;
      s2 ^= t;
      s3 = (s3 << 11) | (s3 >>> 21);
      out[i] = r * INV_TWO_POW_32;
    }
    s[0] = s0;
    s[1] = s1;
    s[2] = s2;
    s[3] = s3;
  }

  /** Like fillUnits, on the full 2^-53 grid (two draws each): for label draws, so P(u < p) = p to double precision. */
  fillUnits53(out: Float64Array, count: number): void {
    const s = this.s;
    let s0 = s[0];
    let s1 = s[1];
    let s2 = s[2];
    let s3 = s[3];
    for (let i = 0; i < 2 * count; i++) {
      const r = Math.imul(rotl(Math.imul(s1, 5), 7), 9) >>> 0;
      const t = s1 << 9;
      s2 ^= s0;
      s3 ^= s1;
      s1 ^= s2;
      s0 ^= s3;
      s2 ^= t;
      s3 = (s3 << 11) | (s3 >>> 21);
      if ((i & 1) === 0) out[i >> 1] = (r >>> 5) * 67108864;
      else out[i >> 1] = (out[i >> 1] + (r >>> 6)) * INV_TWO_POW_53;
    }
    s[0] = s0;
    s[1] = s1;
    s[2] = s2;
    s[3] = s3;
  }

  /** A whole number in [0, n), for n up to 2^32. */
  below(n: number): number {
    return Math.floor(this.unit() * n);
  }

  /** A standard normal draw (polar Box-Muller; the second value of a pair is kept). */
  normal(): number {
    if (this.hasSpare) {
      this.hasSpare = false;
      return this.spare;
    }
    let u: number;
    let v: number;
    let s: number;
    do {
      u = 2 * this.unit() - 1;
      v = 2 * this.unit() - 1;
      s = u * u + v * v;
    } while (s >= 1 || s === 0);
    const f = Math.sqrt((-2 * Math.log(s)) / s);
    this.spare = v * f;
    this.hasSpare = true;
    return u * f;
  }
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}

/** splitmix32 (a 32-bit variant of Steele, Lea & Flood 2014): one well-mixed word per call. */
function splitmix32(state: number): number {
  let z = (state + 0x9e3779b9) | 0;
  z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
  z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
  return (z ^ (z >>> 16)) >>> 0;
}
