import { COORDINATE_PAGE_SHIFT, type HeadState } from "../head-state.js";
import { STAT_FIELDS } from "../progressive-stats.js";
import { sharedFloat64 } from "../shared-float64.js";
import { MAX_KERNEL_PAIRS } from "./ftrl-kernel-wat.js";

const PAGE = 65536;
/** WebAssembly memory is addressed with 32 bits: 4 GiB, less room for the kernel's scratch space. */
const MAX_STATE_BYTES = 4 * 1024 ** 3 - 256 * 1024 ** 2;

/**
 * Heads trained by the WebAssembly kernel (ftrl-kernel-wat.ts): their z and n in
 * a shared WebAssembly memory, laid out for it. Per coordinate c, at byte
 * c * lanes * 16: the block's `lanes` z values, then its `lanes` n values, so one
 * or two cache lines hold all of a coordinate's state (hashed coordinates are
 * cache misses). `lanes` is the head count rounded up to even; a padding head
 * stays 0. At `pagesAt` follows one byte per page of 2^COORDINATE_PAGE_SHIFT
 * coordinates, set by the kernel when it updates one of them (cleared by the
 * merge), then from `scratchAt` the kernel's scratch space. The sums are
 * [slot][heads][STAT_FIELDS], this block's heads only.
 */
export interface SimdHeadBlock {
  /** Global head index of each block head, ascending and consecutive. */
  readonly heads: Int32Array;
  readonly lanes: number;
  readonly coordinateCount: number;
  readonly memory: WebAssembly.Memory;
  readonly pagesAt: number;
  readonly scratchAt: number;
  readonly overall: Float64Array;
  readonly sliceStats: Float64Array;
}

/** Bytes of z and n for `heads` heads over `coordinates` coordinates, or Infinity past the limit. */
export function simdStateBytes(coordinates: number, heads: number): number {
  const bytes = coordinates * lanesFor(heads) * 16;
  return heads > 2 * MAX_KERNEL_PAIRS || bytes > MAX_STATE_BYTES ? Infinity : bytes;
}

/**
 * How many blocks of consecutive heads the state's heads need for the kernel,
 * at least `groups` (one per thread) where there are that many lane pairs, or 0
 * when even one pair per block does not fit in WebAssembly's 4 GiB (train with
 * trainHeadBlock instead). Blocks get whole pairs (see makeTrainingBlocks).
 *
 * @example
 * simdBlockCount(6, 1 << 20, 2); // 2 (heads 0-3 and 4-5)
 */
export function simdBlockCount(heads: number, coordinates: number, groups: number): number {
  const pairs = Math.ceil(heads / 2);
  for (let count = Math.max(1, Math.min(groups, pairs)); count <= pairs; count++) {
    const largest = Math.min(heads, 2 * Math.ceil(pairs / count));
    if (simdStateBytes(coordinates, largest) < Infinity) return count;
  }
  return 0;
}

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
  forEachPage(state.writtenPages, coordinates, 0, (from, to) => {
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
  forEachPage(marks.subarray(0, toPage), coordinates, fromPage, (from, to) => {
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

/** Calls `copy(from, to)` for the coordinate range of each marked page from `firstPage` on. */
function forEachPage(
  marks: Uint8Array,
  coordinates: number,
  firstPage: number,
  copy: (from: number, to: number) => void,
): void {
  const size = 2 ** COORDINATE_PAGE_SHIFT;
  for (let page = firstPage; page < marks.length; page++) {
    if (marks[page] !== 0) copy(page * size, Math.min(coordinates, (page + 1) * size));
  }
}

function align(bytes: number): number {
  return Math.ceil(bytes / 64) * 64;
}

function lanesFor(heads: number): number {
  return heads + (heads & 1);
}
