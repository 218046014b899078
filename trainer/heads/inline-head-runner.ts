import type { FtrlRule, HeadBlock } from "./head-block.js";
import type { HeadRunner } from "./head-runner.js";
import type { HeadBatch } from "./head-setup.js";
import type { HeadState } from "./head-state.js";
import { makeFtrlRule } from "./make-ftrl-rule.js";
import { packLabels } from "./pack-labels.js";
import { trainHeadBlock } from "./train-head-block.js";

/**
 * Trains every head on the calling thread, straight on the state's arrays.
 *
 * @example
 * const runner = new InlineHeadRunner(state);
 * await runner.submit(batch, state.rowCount, maxRowLength);
 */
export class InlineHeadRunner implements HeadRunner {
  private readonly state: HeadState;
  private readonly rule: FtrlRule;
  private readonly heads: Int32Array;
  private labels = new Uint8Array(0);
  private slots = new Int32Array(0);

  constructor(state: HeadState) {
    this.state = state;
    this.rule = makeFtrlRule(state.info);
    this.heads = Int32Array.from(state.info.outcomes, (_, h) => h);
  }

  submit(batch: HeadBatch, rowBase: number, maxRowLength: number): Promise<void> {
    const { rowCount } = batch.encoded;
    const { state } = this;
    const stats = state.progressive;
    if (this.labels.length < rowCount * state.headCount) {
      this.labels = new Uint8Array(rowCount * state.headCount);
      this.slots = new Int32Array(rowCount);
    }
    packLabels(batch.labels, rowCount, this.labels);
    if (batch.timestamps !== null) {
      stats.assignSlots(batch.timestamps, rowCount, this.slots);
      stats.ensureCapacity();
    }
    const block: HeadBlock = {
      heads: this.heads,
      stride: state.headCount,
      offset: 0,
      z: state.z,
      n: state.n,
      overall: stats.overall,
      sliceStats: stats.sliceStats,
    };
    trainHeadBlock(block, this.rule, {
      rowCount,
      offsets: batch.encoded.offsets,
      index: batch.encoded.index,
      value: batch.encoded.value,
      labels: this.labels,
      weights: batch.weights,
      slots: batch.timestamps === null ? null : this.slots,
      rowBase,
      maxRowLength,
    });
    return Promise.resolve();
  }

  drain(): Promise<void> {
    return Promise.resolve();
  }

  close(): Promise<void> {
    return Promise.resolve();
  }
}
