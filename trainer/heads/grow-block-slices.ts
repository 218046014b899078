import { isSimdBlock, type TrainingBlock } from "./block-trainer.js";
import type { HeadState } from "./head-state.js";
import { STAT_FIELDS } from "./progressive-stats.js";
import { sharedFloat64 } from "./shared-float64.js";

/**
 * Gives every block room for the slices the state has registered so far,
 * replacing entries of `blocks` whose per-slice sums moved; returns, per block,
 * the new array or null. A block viewing the state's arrays follows the state's
 * (larger) array; a block with its own sums gets a doubled copy. Threads must
 * be idle.
 *
 * @example
 * const moved = growBlockSlices(state, blocks);
 * moved.forEach((s, b) => s !== null && trainers[b].useSliceStats(s));
 */
export function growBlockSlices(
  state: HeadState,
  blocks: TrainingBlock[],
): (Float64Array | null)[] {
  const stats = state.progressive;
  stats.ensureCapacity();
  return blocks.map((block, b) => {
    if (!isSimdBlock(block) && block.z === state.z) {
      if (block.sliceStats === stats.sliceStats) return null;
      blocks[b] = { ...block, sliceStats: stats.sliceStats };
      return stats.sliceStats;
    }
    const hb = block.heads.length;
    let capacity = block.sliceStats.length / (hb * STAT_FIELDS);
    if (capacity >= stats.sliceCount) return null;
    while (capacity < stats.sliceCount) capacity *= 2;
    const larger = sharedFloat64(capacity * hb * STAT_FIELDS);
    larger.set(block.sliceStats);
    blocks[b] = { ...block, sliceStats: larger };
    return larger;
  });
}
