import type { HeadState } from "../head-state.js";
import { STAT_FIELDS } from "../progressive-stats.js";
import { sharedFloat64 } from "../shared-float64.js";
import {
  align,
  forEachMarkedPage,
  lanesFor,
  simdStateBytes,
  type SimdHeadBlock,
} from "./simd-head-block.js";

const PAGE = 65536;

/**
 * Copies `count` heads of a state, from `first`, into a new block for the kernel.
 *
 * @example
 * const block = createSimdHeadBlock(state, 0, 3);
 */
export function createSimdHeadBlock(state: HeadState, first: number, count: number): SimdHeadBlock {
  const lanes = lanesFor(count);
  const coordinates = state.coordinateCount;
  const pagesAt = align(simdStateBytes(coordinates, count));
  const scratchAt = align(pagesAt + state.writtenPages.length);
  const memory = new WebAssembly.Memory({
    initial: Math.ceil(scratchAt / PAGE) + 1,
    maximum: 65536,
    shared: true,
  });
  const f64 = new Float64Array(memory.buffer, 0, coordinates * lanes * 2);
  // The memory starts zeroed: only pages the state has written need copying.
  const heads = state.headCount;
  forEachMarkedPage(state.writtenPages, coordinates, 0, (from, to) => {
    for (let c = from; c < to; c++) {
      const block = c * lanes * 2;
      const at = c * heads + first;
      for (let h = 0; h < count; h++) {
        f64[block + h] = state.z[at + h];
        f64[block + lanes + h] = state.n[at + h];
      }
    }
  });
  const stats = state.progressive;
  stats.ensureCapacity();
  const overall = sharedFloat64(count * STAT_FIELDS);
  overall.set(stats.overall.subarray(first * STAT_FIELDS, (first + count) * STAT_FIELDS));
  const sliceStats = sharedFloat64(stats.sliceCapacity * count * STAT_FIELDS);
  for (let s = 0; s < stats.sliceCapacity; s++) {
    const at = (s * heads + first) * STAT_FIELDS;
    sliceStats.set(
      stats.sliceStats.subarray(at, at + count * STAT_FIELDS),
      s * count * STAT_FIELDS,
    );
  }
  return {
    heads: Int32Array.from({ length: count }, (_, h) => first + h),
    lanes,
    coordinateCount: coordinates,
    memory,
    pagesAt,
    scratchAt,
    overall,
    sliceStats,
  };
}
