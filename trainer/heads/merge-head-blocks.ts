import type { HeadBlock } from "./head-block.js";
import type { HeadState } from "./head-state.js";
import { STAT_FIELDS } from "./progressive-stats.js";

/**
 * Copies blocks made by splitHeadBlocks back into the state's [coordinate][head]
 * arrays and progressive sums. A block that is the state's own arrays needs no copy.
 *
 * @example
 * mergeHeadBlocks(state, blocks); // state.z, state.n now hold what the workers learned
 */
export function mergeHeadBlocks(state: HeadState, blocks: readonly HeadBlock[]): void {
  const heads = state.headCount;
  const stats = state.progressive;
  stats.ensureCapacity();
  for (const block of blocks) {
    if (block.z === state.z) continue;
    const hb = block.stride;
    const first = block.heads[0];
    for (let c = 0; c < state.coordinateCount; c++) {
      for (let h = 0; h < hb; h++) {
        state.z[c * heads + first + h] = block.z[c * hb + h];
        state.n[c * heads + first + h] = block.n[c * hb + h];
      }
    }
    const slots = Math.min(stats.sliceCapacity, block.sliceStats.length / (hb * STAT_FIELDS));
    for (let s = 0; s < slots; s++) {
      const part = block.sliceStats.subarray(s * hb * STAT_FIELDS, (s + 1) * hb * STAT_FIELDS);
      stats.sliceStats.set(part, (s * heads + first) * STAT_FIELDS);
    }
    stats.overall.set(block.overall, first * STAT_FIELDS);
  }
}
