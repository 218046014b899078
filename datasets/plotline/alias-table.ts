/**
 * Walker's alias method (Walker 1977; the construction of Vose 1991): draws an
 * index in proportion to its weight in constant time, which beats a binary
 * search over 50,000 viewers on every row. It serves several independent
 * segments of one weight array (one segment per garden site, say); segment s
 * covers [start[s], start[s + 1]).
 *
 * @example
 * const table = new AliasTable(Float64Array.of(1, 3));
 * table.draw(0, rng.unit()); // 1 three times as often as 0
 */
export class AliasTable {
  private readonly start: Int32Array;
  /** Chance of keeping the drawn slot rather than taking its alias. */
  private readonly keep: Float64Array;
  /** Absolute index of each slot's alias. */
  private readonly alias: Int32Array;

  /** Weights must be positive; `start` defaults to one segment over all of them. */
  constructor(weights: Float64Array, start: Int32Array = Int32Array.of(0, weights.length)) {
    const n = weights.length;
    this.start = start;
    this.keep = new Float64Array(n);
    this.alias = new Int32Array(n);
    const small = new Int32Array(n);
    const large = new Int32Array(n);
    for (let s = 0; s + 1 < start.length; s++) {
      const lo = start[s];
      const hi = start[s + 1];
      let total = 0;
      for (let i = lo; i < hi; i++) total += weights[i];
      let ns = 0;
      let nl = 0;
      for (let i = lo; i < hi; i++) {
        this.keep[i] = (weights[i] * (hi - lo)) / total;
        this.alias[i] = i;
        if (this.keep[i] < 1) small[ns++] = i;
        else large[nl++] = i;
      }
      while (ns > 0 && nl > 0) {
        const l = small[--ns];
        const g = large[nl - 1];
        this.alias[l] = g;
        this.keep[g] += this.keep[l] - 1;
        if (this.keep[g] < 1) {
          nl--;
          small[ns++] = g;
        }
      }
      // Whatever is left holds 1 up to rounding.
      while (nl > 0) this.keep[large[--nl]] = 1;
      while (ns > 0) this.keep[small[--ns]] = 1;
    }
  }

  /** An index of `segment` from one uniform u in [0, 1): the whole part of u * size picks the slot, the fraction decides slot or alias. */
  draw(segment: number, u: number): number {
    const lo = this.start[segment];
    const x = u * (this.start[segment + 1] - lo);
    const slot = Math.floor(x);
    const i = lo + slot;
    return x - slot < this.keep[i] ? i : this.alias[i];
  }
}
