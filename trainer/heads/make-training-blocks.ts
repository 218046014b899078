import type { HeadKernelChoice, TrainingBlock } from "./block-trainer.js";
import type { HeadState } from "./head-state.js";
import { createSimdHeadBlock } from "./simd/create-simd-head-block.js";
import { simdBlockCount } from "./simd/simd-head-block.js";
import { splitHeadBlocks } from "./split-head-blocks.js";

/**
 * Divides a state's heads into blocks of consecutive heads, at least `groups`
 * of them (one per thread). For the WebAssembly kernel each block gets its own
 * copy of its heads in the kernel's layout (more blocks if 4 GiB would not hold
 * fewer); when the state is too large for it, or with `kernel` "js", blocks are
 * for trainHeadBlock and `copies` says whether they copy or view the state's
 * arrays (see splitHeadBlocks). mergeTrainingBlocks copies back.
 *
 * @example
 * const blocks = makeTrainingBlocks(state, 2, "simd", true); // heads 0-2 and 3-5 of six
 */
export function makeTrainingBlocks(
  state: HeadState,
  groups: number,
  kernel: HeadKernelChoice,
  copies: boolean,
): TrainingBlock[] {
  const heads = state.headCount;
  const count = kernel === "simd" ? simdBlockCount(heads, state.coordinateCount, groups) : 0;
  if (count === 0) return splitHeadBlocks(state, groups, copies);
  // Whole lane pairs per block, as even as possible: a block of an odd number of
  // heads computes a padding lane, so 6 heads on 2 threads go 4 + 2, not 3 + 3.
  const pairs = Math.ceil(heads / 2);
  const blocks: TrainingBlock[] = [];
  for (let b = 0, first = 0; b < count && first < heads; b++) {
    const blockPairs = Math.floor(pairs / count) + (b < pairs % count ? 1 : 0);
    const size = Math.min(2 * blockPairs, heads - first);
    blocks.push(createSimdHeadBlock(state, first, size));
    first += size;
  }
  return blocks;
}
