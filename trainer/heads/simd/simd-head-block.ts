import { COORDINATE_PAGE_SHIFT } from "../head-state.js";
import { MAX_KERNEL_PAIRS } from "./ftrl-kernel-wat.js";

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
 * Calls `copy(from, to)` for the coordinate range of each marked page from `firstPage` on.
 *
 * @example
 * forEachMarkedPage(state.writtenPages, state.coordinateCount, 0, (from, to) => copy(from, to));
 */
export function forEachMarkedPage(
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

/** Heads rounded up to even: the lanes of a block's layout. */
export function lanesFor(heads: number): number {
  return heads + (heads & 1);
}

/** Bytes rounded up to a cache line. */
export function align(bytes: number): number {
  return Math.ceil(bytes / 64) * 64;
}
