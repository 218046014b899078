import type { FtrlRule, HeadBlock, KernelBatch } from "./head-block.js";
import type { SimdHeadBlock } from "./simd/simd-head-block.js";
import { SimdHeadKernel } from "./simd/simd-head-kernel.js";
import { trainHeadBlock } from "./train-head-block.js";

/** A block of heads as one thread trains it: for the WebAssembly kernel, or for trainHeadBlock. */
export type TrainingBlock = HeadBlock | SimdHeadBlock;

/** Which kernel trains the heads: "simd" (WebAssembly, where the state fits its memory) or "js". */
export type HeadKernelChoice = "simd" | "js";

/** True for a block laid out for the WebAssembly kernel. */
export function isSimdBlock(block: TrainingBlock): block is SimdHeadBlock {
  return "memory" in block;
}

/**
 * Trains one block on the thread that made it, with the kernel its layout is
 * for; both kernels give the same bits (test/heads/simd-kernel-parity.test.ts).
 *
 * @example
 * const trainer = new BlockTrainer(block, rule);
 * trainer.train(batch);
 */
export class BlockTrainer {
  private block: TrainingBlock;
  private readonly rule: FtrlRule;
  private readonly kernel: SimdHeadKernel | null;

  constructor(block: TrainingBlock, rule: FtrlRule) {
    this.block = block;
    this.rule = rule;
    this.kernel = isSimdBlock(block) ? new SimdHeadKernel(block, rule) : null;
  }

  /** Moves the block's per-slice sums to a larger array (slices outgrew the old one). */
  useSliceStats(sliceStats: Float64Array): void {
    this.block = { ...this.block, sliceStats };
    this.kernel?.useSliceStats(sliceStats);
  }

  train(batch: KernelBatch): void {
    if (this.kernel !== null) this.kernel.train(batch);
    else trainHeadBlock(this.block as HeadBlock, this.rule, batch);
  }
}
