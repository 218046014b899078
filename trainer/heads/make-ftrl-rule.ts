import type { FtrlRule } from "./head-block.js";
import type { HeadStateInfo } from "./resolve-head-state-info.js";

// With beta = 0, a coordinate that never had a gradient would weigh 0 / 0; this
// floor makes it 0 and changes beta + sqrt(n) only when sqrt(n) < ~1e-284.
const BETA_FLOOR = 1e-300;

/**
 * The rule the training kernels and the export apply, from a state's settings:
 * one place decides the effective beta, so training and export agree.
 *
 * @example
 * trainHeadBlock(block, makeFtrlRule(state.info), batch);
 */
export function makeFtrlRule(info: HeadStateInfo): FtrlRule {
  return {
    alpha: info.alpha,
    beta: info.beta > 0 ? info.beta : BETA_FLOOR,
    lambda1: info.lambda1,
    lambda2: info.lambda2,
    biasCoordinate: info.indexSize,
    seed: info.seed,
    keepRate: Float64Array.from(info.negativeKeepRate),
    weightNegatives: info.downsampleCorrection === "weight",
  };
}
