import { isSimdBlock, type TrainingBlock } from "./block-trainer.js";
import { ruleWeight } from "./ftrl-weight.js";
import type { FtrlRule } from "./head-block.js";
import { COORDINATE_PAGE_SHIFT, type HeadState } from "./head-state.js";

/** One snapshot to fold into the moving average of the weights (see weight-average.ts). */
export interface WeightFold {
  /** The state's average, [coordinate][heads], on shared memory: each thread writes its own heads. */
  readonly average: Float64Array;
  /** Heads in the state (the stride of `average`). */
  readonly heads: number;
  readonly coordinateCount: number;
  /** The state's written pages as of the last merge (shared memory). */
  readonly writtenPages: Uint8Array;
  /** This snapshot's share: average += share * (latest - average). */
  readonly share: number;
}

/**
 * Folds the latest weights of one block's heads into the average, straight from
 * the block's own z and n, on the thread that trains it: no merge into the state
 * first, and every thread folds its heads at once. A WebAssembly block visits the
 * pages written before the last merge or marked since; a JavaScript block keeps
 * no marks and visits every page. Where a weight and its average are both zero
 * nothing is written, so untouched memory stays untouched. Each element gets the
 * same arithmetic wherever it is folded, so the average is bit for bit the same
 * on any number of threads.
 *
 * @example
 * foldBlockWeights(block, rule, { average, heads: 6, coordinateCount, writtenPages, share: 0.08 });
 */
export function foldBlockWeights(block: TrainingBlock, rule: FtrlRule, fold: WeightFold): void {
  const { average, heads, coordinateCount, writtenPages, share } = fold;
  const count = block.heads.length;
  const first = block.heads[0];
  const invAlpha = 1 / rule.alpha;
  const simd = isSimdBlock(block);
  // Where coordinate c's z and n of block head j sit: z at c * zStride + zOffset + j, n at + nGap.
  const z = simd
    ? new Float64Array(block.memory.buffer, 0, block.coordinateCount * block.lanes * 2)
    : block.z;
  const n = simd ? z : block.n;
  const zStride = simd ? block.lanes * 2 : block.stride;
  const zOffset = simd ? 0 : block.offset;
  const nGap = simd ? block.lanes : 0;
  const marks = simd
    ? new Uint8Array(block.memory.buffer, block.pagesAt, writtenPages.length)
    : null;
  const pageSize = 2 ** COORDINATE_PAGE_SHIFT;
  for (let page = 0; page < writtenPages.length; page++) {
    if (marks !== null && writtenPages[page] === 0 && marks[page] === 0) continue;
    const end = Math.min(coordinateCount, (page + 1) * pageSize);
    for (let c = page * pageSize; c < end; c++) {
      const from = c * zStride + zOffset;
      for (let j = 0; j < count; j++) {
        const w = ruleWeight(rule, invAlpha, c, z[from + j], n[from + nGap + j]);
        const at = c * heads + first + j;
        const a = average[at];
        if (w !== 0 || a !== 0) average[at] = a + share * (w - a);
      }
    }
  }
}

/**
 * The fold a runner is asked for: the state's average, with `share`; learnHeads
 * asks for one whenever the row count reaches a multiple of averaging.everyRows,
 * and moves averageMass on itself.
 *
 * @example
 * await runner.fold(snapshotShare(everyRows, halfLifeRows)); // the runner calls weightFold(state, share)
 */
export function weightFold(state: HeadState, share: number): WeightFold {
  if (state.average === null) throw new Error("weightFold: the state has no averaging");
  return {
    average: state.average,
    heads: state.headCount,
    coordinateCount: state.coordinateCount,
    writtenPages: state.writtenPages,
    share,
  };
}
