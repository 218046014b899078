import type { CompiledForest } from "./compile-forest.js";
import { traverseBitset } from "./traverse-bitset.js";
import { traverseNumeric } from "./traverse-numeric.js";
import { traverseOneHot } from "./traverse-one-hot.js";

/**
 * Runs the forest's traversal kernel over `count` rows of a row block (numbers in
 * `block`, categorical codes in `codes`, see InputPlan): for row i
 * and tree t, writes `leafBase + t * leafStride + leaf` to
 * `out[i * outStride + outOffset + t]` (leafStride 2^depth and leafBase the
 * forest's leaf offset give encoded indexes; 0 and 0 give leaf numbers).
 *
 * @example
 * forestKernel(forest, block, codes, plan.stride, rows, out, forest.treeCount, 0, 0, 0); // leaf numbers
 */
export function forestKernel(
  forest: CompiledForest,
  block: Float64Array,
  codes: Int32Array,
  stride: number,
  count: number,
  out: Int32Array,
  outStride: number,
  outOffset: number,
  leafBase: number,
  leafStride: number,
): void {
  const f = forest;
  if (f.kernel === "numeric") {
    traverseNumeric(
      f.offset,
      f.threshold,
      f.nodes,
      f.depth,
      f.treeCount,
      block,
      stride,
      count,
      out,
      outStride,
      outOffset,
      leafBase,
      leafStride,
    );
  } else if (f.kernel === "one-hot") {
    traverseOneHot(
      f.offset,
      f.threshold,
      f.mask,
      f.nodes,
      f.depth,
      f.treeCount,
      block,
      codes,
      stride,
      count,
      out,
      outStride,
      outOffset,
      leafBase,
      leafStride,
    );
  } else {
    traverseBitset(
      f.offset,
      f.threshold,
      f.bitsStart,
      f.bits,
      f.codeMask,
      f.nodes,
      f.depth,
      f.treeCount,
      block,
      codes,
      stride,
      count,
      out,
      outStride,
      outOffset,
      leafBase,
      leafStride,
    );
  }
}
