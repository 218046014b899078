import type { CompiledHeads } from "./compile-heads.js";
import { clipStandardized } from "./clip-standardized.js";
import type { InputPlan } from "./compile-inputs.js";

/**
 * Adds the heads' weights of the standardized numerics to z: (x - mean) / std
 * times the weight; a missing or infinite value adds nothing (reads 0).
 *
 * @example
 * addNumericWeights(plan, block, rows, heads, z);
 */
export function addNumericWeights(
  plan: InputPlan,
  block: Float64Array,
  count: number,
  heads: CompiledHeads,
  z: Float64Array,
): void {
  const feature = plan.standardizedFeature;
  const mean = plan.mean;
  const std = plan.std;
  const weight = heads.numericWeight;
  const lanes = heads.lanes;
  const headCount = heads.headCount;
  const stride = plan.stride;
  for (let i = 0; i < count; i++) {
    const zo = i * lanes;
    for (let j = 0; j < feature.length; j++) {
      const x = block[i * stride + feature[j]];
      if (!Number.isFinite(x)) continue;
      const v = clipStandardized(x, mean[j], std[j]);
      const g = j * lanes;
      for (let h = 0; h < headCount; h++) z[zo + h] += weight[g + h] * v;
    }
  }
}
