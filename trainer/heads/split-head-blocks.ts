import type { HeadBlock } from "./head-block.js";
import type { HeadState } from "./head-state.js";
import { STAT_FIELDS } from "./progressive-stats.js";
import { sharedFloat64 } from "./shared-float64.js";

/**
 * Divides a state's heads into `groups` contiguous blocks, one per thread. With
 * `copies` false every block views the state's own (shared) arrays; with
 * `copies` true each gets its own arrays in shared memory, so that two threads
 * never write the same cache line (in the [coordinate][head] layout, the heads
 * of two threads share lines on most coordinates), at the price of a second
 * copy of z and n; mergeHeadBlocks copies them back.
 *
 * @example
 * const blocks = splitHeadBlocks(state, 2, true); // heads 0-2 and 3-5 of six
 */
export function splitHeadBlocks(state: HeadState, groups: number, copies: boolean): HeadBlock[] {
  const heads = state.headCount;
  const stats = state.progressive;
  stats.ensureCapacity();
  const size = Math.ceil(heads / Math.max(1, groups));
  const blocks: HeadBlock[] = [];
  for (let first = 0; first < heads; first += size) {
    const blockHeads = Int32Array.from(
      { length: Math.min(size, heads - first) },
      (_, h) => first + h,
    );
    const hb = blockHeads.length;
    if (!copies || hb === heads) {
      blocks.push({
        heads: blockHeads,
        stride: heads,
        offset: first,
        z: state.z,
        n: state.n,
        overall: stats.overall,
        sliceStats: stats.sliceStats,
      });
      continue;
    }
    const block: HeadBlock = {
      heads: blockHeads,
      stride: hb,
      offset: 0,
      z: sharedFloat64(state.coordinateCount * hb),
      n: sharedFloat64(state.coordinateCount * hb),
      overall: sharedFloat64(hb * STAT_FIELDS),
      sliceStats: sharedFloat64(stats.sliceCapacity * hb * STAT_FIELDS),
    };
    for (let c = 0; c < state.coordinateCount; c++) {
      for (let h = 0; h < hb; h++) {
        block.z[c * hb + h] = state.z[c * heads + first + h];
        block.n[c * hb + h] = state.n[c * heads + first + h];
      }
    }
    copyStats(stats.overall, heads, block.overall, hb, first, 1);
    copyStats(stats.sliceStats, heads, block.sliceStats, hb, first, stats.sliceCapacity);
    blocks.push(block);
  }
  return blocks;
}

/** Copies [slot][head][field] sums of heads first.. into a block's [slot][blockHead][field]. */
function copyStats(
  from: Float64Array,
  heads: number,
  to: Float64Array,
  hb: number,
  first: number,
  slots: number,
): void {
  for (let s = 0; s < slots; s++) {
    const source = (s * heads + first) * STAT_FIELDS;
    to.set(from.subarray(source, source + hb * STAT_FIELDS), s * hb * STAT_FIELDS);
  }
}
