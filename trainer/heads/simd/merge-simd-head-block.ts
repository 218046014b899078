import { COORDINATE_PAGE_SHIFT, type HeadState } from "../head-state.js";
import { STAT_FIELDS } from "../progressive-stats.js";
import { forEachMarkedPage, type SimdHeadBlock } from "./simd-head-block.js";

/**
 * Copies what the kernel changed since the last merge (the pages it marked) and
 * the block's sums back into the state's [coordinate][head] arrays.
 *
 * @example
 * mergeSimdHeadBlock(state, block); // state.z, state.n now hold what the kernel learned
 */
export function mergeSimdHeadBlock(state: HeadState, block: SimdHeadBlock): void {
  const pages = state.writtenPages.length;
  copyMarkedPages(block, state.z, state.n, state.headCount, 0, pages);
  settleSimdMerge(state, block);
}

/**
 * The first part of a merge, for any thread: copies a block's marked pages in
 * [fromPage, toPage) into z and n laid out [coordinate][heads]. Threads given
 * disjoint page ranges can share the work; settleSimdMerge finishes it.
 *
 * @example
 * copyMarkedPages(block, state.z, state.n, state.headCount, 0, 1024);
 */
export function copyMarkedPages(
  block: SimdHeadBlock,
  z: Float64Array,
  n: Float64Array,
  heads: number,
  fromPage: number,
  toPage: number,
): void {
  const { lanes, coordinateCount: coordinates } = block;
  const count = block.heads.length;
  const first = block.heads[0];
  const f64 = new Float64Array(block.memory.buffer, 0, coordinates * lanes * 2);
  const marks = new Uint8Array(block.memory.buffer, block.pagesAt, pageCount(coordinates));
  forEachMarkedPage(marks.subarray(0, toPage), coordinates, fromPage, (from, to) => {
    for (let c = from; c < to; c++) {
      const at = c * lanes * 2;
      const into = c * heads + first;
      for (let h = 0; h < count; h++) {
        z[into + h] = f64[at + h];
        n[into + h] = f64[at + lanes + h];
      }
    }
  });
}

/**
 * The last part of a merge, once every page is copied: records the copied pages
 * as written in the state, clears the block's marks and copies its sums.
 *
 * @example
 * settleSimdMerge(state, block);
 */
export function settleSimdMerge(state: HeadState, block: SimdHeadBlock): void {
  const count = block.heads.length;
  const first = block.heads[0];
  const heads = state.headCount;
  const marks = new Uint8Array(block.memory.buffer, block.pagesAt, state.writtenPages.length);
  marks.forEach((mark, page) => {
    if (mark !== 0) state.writtenPages[page] = 1;
  });
  marks.fill(0);
  const stats = state.progressive;
  stats.ensureCapacity();
  const slots = Math.min(stats.sliceCapacity, block.sliceStats.length / (count * STAT_FIELDS));
  for (let s = 0; s < slots; s++) {
    const part = block.sliceStats.subarray(s * count * STAT_FIELDS, (s + 1) * count * STAT_FIELDS);
    stats.sliceStats.set(part, (s * heads + first) * STAT_FIELDS);
  }
  stats.overall.set(block.overall, first * STAT_FIELDS);
}

function pageCount(coordinates: number): number {
  return Math.ceil(coordinates / 2 ** COORDINATE_PAGE_SHIFT);
}
