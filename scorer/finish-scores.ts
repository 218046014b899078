import type { CompiledHeads } from "./compile-heads.js";

/**
 * Turns summed weights into served numbers for rows [0, count): per head
 * p = 1 / (1 + exp(-(bias + z))), then the negative-downsampling correction
 * q = p / (p + (1 - p) / rate) (He et al. 2014), written to
 * probability[h][start + i]; the combined score sum(valueWeight * q) to
 * combined[start + i].
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
  for (let h = 0; h < heads.headCount; h++) {
    const out = probability[h];
    const b = bias[h];
    const r = rate[h];
    for (let i = 0; i < count; i++) {
      const p = 1 / (1 + Math.exp(-(b + z[i * lanes + h])));
      out[start + i] = r === 1 ? p : p / (p + (1 - p) / r);
    }
  }
  for (let i = 0; i < count; i++) {
    let sum = 0;
    for (let h = 0; h < heads.headCount; h++) sum += valueWeight[h] * probability[h][start + i];
    combined[start + i] = sum;
  }
}
