import type { CompiledHeads } from "./compile-heads.js";

/**
 * Turns summed weights into served numbers for rows [0, count): per head the
 * probability p = 1 / (1 + e), e = exp(-(bias + z)), with the
 * negative-downsampling correction q = p / (p + (1 - p) / rate) (He et al. 2014)
 * folded in as q = 1 / (1 + e / rate) (the same number up to rounding, two divisions
 * instead of three), written to probability[h][start + i]; the combined score
 * sum(valueWeight * q), in head order, to combined[start + i]. Head by head, so
 * every loop runs over one output array.
 *
 * @example
 * finishScores(heads, z, rows, probabilities, combined, 0);
 */
export function finishScores(
  heads: CompiledHeads,
  z: Float64Array,
  count: number,
  probability: readonly Float64Array[],
  combined: Float64Array,
  start: number,
): void {
  const lanes = heads.lanes;
  const bias = heads.bias;
  const rate = heads.negativeKeepRate;
  const valueWeight = heads.valueWeight;
  combined.fill(0, start, start + count);
  for (let h = 0; h < heads.headCount; h++) {
    const out = probability[h];
    const b = bias[h];
    const r = rate[h];
    const w = valueWeight[h];
    for (let i = 0; i < count; i++) {
      // Divided, not multiplied by 1 / r: a rate near the smallest double would make
      // that infinite, and 0 * Infinity is NaN where q should be 1.
      const q = 1 / (1 + Math.exp(-(b + z[i * lanes + h])) / r);
      out[start + i] = q;
      combined[start + i] += w * q;
    }
  }
}
