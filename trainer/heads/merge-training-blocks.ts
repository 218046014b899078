import { isSimdBlock, type TrainingBlock } from "./block-trainer.js";
import type { HeadState } from "./head-state.js";
import { mergeHeadBlocks } from "./merge-head-blocks.js";
import { mergeSimdHeadBlock } from "./simd/merge-simd-head-block.js";

/**
 * Brings the state's z, n and progressive sums up to date from blocks made by
 * makeTrainingBlocks (threads must be idle).
 *
 * @example
 * mergeTrainingBlocks(state, blocks);
 */
export function mergeTrainingBlocks(state: HeadState, blocks: readonly TrainingBlock[]): void {
  for (const block of blocks) {
    if (isSimdBlock(block)) {
      mergeSimdHeadBlock(state, block);
    } else {
      // trainHeadBlock keeps no page marks: any page may have been written.
      mergeHeadBlocks(state, [block]);
      state.writtenPages.fill(1);
    }
  }
}
