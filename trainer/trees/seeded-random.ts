/**
 * A small seeded pseudo-random generator (SplitMix32-style mixing over a Weyl
 * sequence). Every random choice of tree fitting (bin sample, validation draw,
 * row and feature subsampling) draws from one of these, so a seed fixes the trees.
 * Not for cryptography.
 *
 * @example
 * const random = new SeededRandom(7);
 * random.nextFloat(); // in [0, 1)
 * random.nextInt(10); // in 0..9
 */
export class SeededRandom {
  private readonly seed: number;
  private state: number;

  constructor(seed: number) {
    this.seed = seed >>> 0;
    // Mix the seed once so that nearby seeds (1, 2, 3) start far apart.
    this.state = mix32(this.seed ^ 0x9e3779b9);
  }

  /** A uniform 32-bit unsigned integer. */
  nextUint32(): number {
    this.state = (this.state + 0x9e3779b9) | 0;
    return mix32(this.state);
  }

  /** A uniform float in [0, 1) with 32 random bits. */
  nextFloat(): number {
    return this.nextUint32() / 4294967296;
  }

  /** A uniform integer in 0 .. n - 1 (n <= 2^32); rejection keeps it unbiased. */
  nextInt(n: number): number {
    if (n <= 1) return 0;
    if (n > 4294967296) return this.nextLargeInt(n);
    const limit = 4294967296 - (4294967296 % n);
    let x = this.nextUint32();
    while (x >= limit) x = this.nextUint32();
    return x % n;
  }

  /**
   * Uniform in [0, n) for n above 2^32 (a reservoir past 2^32 rows): 53 random bits,
   * rejection-sampled so that no value is favoured.
   */
  private nextLargeInt(n: number): number {
    const span = 2 ** 53;
    const limit = span - (span % n);
    while (true) {
      const x = (this.nextUint32() >>> 11) * 4294967296 + this.nextUint32();
      if (x < limit) return x % n;
    }
  }

  /** A generator for a sub-task (e.g. tree t), independent of how much this one has drawn. */
  fork(stream: number): SeededRandom {
    return new SeededRandom(mix32(this.seed ^ Math.imul(stream + 1, 0x85ebca6b)));
  }
}

function mix32(value: number): number {
  let z = value | 0;
  z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
  z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
  return (z ^ (z >>> 16)) >>> 0;
}
