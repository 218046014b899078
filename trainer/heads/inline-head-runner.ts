import { BlockTrainer, type HeadKernelChoice, type TrainingBlock } from "./block-trainer.js";
import { foldBlockWeights, weightFold } from "./fold-block-weights.js";
import { growBlockSlices } from "./grow-block-slices.js";
import type { FtrlRule } from "./head-block.js";
import type { HeadRunner } from "./head-runner.js";
import type { HeadBatch } from "./head-setup.js";
import type { HeadState } from "./head-state.js";
import { makeFtrlRule } from "./make-ftrl-rule.js";
import { makeTrainingBlocks } from "./make-training-blocks.js";
import { mergeTrainingBlocks } from "./merge-training-blocks.js";
import { packLabels } from "./pack-labels.js";

/**
 * Trains every head on the calling thread: with the WebAssembly kernel on its
 * own copy of the heads (merged back by drain), or with trainHeadBlock straight
 * on the state's arrays.
 *
 * @example
 * const runner = new InlineHeadRunner(state);
 * await runner.submit(batch, state.rowCount, maxRowLength);
 * await runner.drain(); // state.z and state.n are current
 */
export class InlineHeadRunner implements HeadRunner {
  private readonly state: HeadState;
  private readonly blocks: TrainingBlock[];
  private readonly trainers: BlockTrainer[];
  private readonly rule: FtrlRule;
  private labels = new Uint8Array(0);
  private slots = new Int32Array(0);

  constructor(state: HeadState, kernel: HeadKernelChoice = "simd") {
    this.state = state;
    this.blocks = makeTrainingBlocks(state, 1, kernel, false);
    const rule = makeFtrlRule(state.info);
    this.rule = rule;
    this.trainers = this.blocks.map((block) => new BlockTrainer(block, rule));
  }

  submit(batch: HeadBatch, rowBase: number, maxRowLength: number): Promise<void> {
    const { rowCount } = batch.encoded;
    const { state } = this;
    if (this.labels.length < rowCount * state.headCount) {
      this.labels = new Uint8Array(rowCount * state.headCount);
      this.slots = new Int32Array(rowCount);
    }
    packLabels(batch.labels, rowCount, this.labels);
    if (batch.timestamps !== null) {
      state.progressive.assignSlots(batch.timestamps, rowCount, this.slots);
    }
    growBlockSlices(state, this.blocks).forEach((moved, b) => {
      if (moved !== null) this.trainers[b].useSliceStats(moved);
    });
    const kernelBatch = {
      rowCount,
      offsets: batch.encoded.offsets,
      index: batch.encoded.index,
      value: batch.encoded.value,
      labels: this.labels,
      weights: batch.weights,
      slots: batch.timestamps === null ? null : this.slots,
      rowBase,
      maxRowLength,
    };
    for (const trainer of this.trainers) trainer.train(kernelBatch);
    return Promise.resolve();
  }

  fold(share: number): Promise<void> {
    for (const block of this.blocks)
      foldBlockWeights(block, this.rule, weightFold(this.state, share));
    return Promise.resolve();
  }

  drain(): Promise<void> {
    mergeTrainingBlocks(this.state, this.blocks);
    return Promise.resolve();
  }

  close(): Promise<void> {
    return Promise.resolve();
  }
}
