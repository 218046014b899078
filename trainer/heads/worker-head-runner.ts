import { Worker } from "node:worker_threads";
import { LeafcastError } from "../errors.js";
import {
  BlockTrainer,
  isSimdBlock,
  type HeadKernelChoice,
  type TrainingBlock,
} from "./block-trainer.js";
import { foldBlockWeights, weightFold } from "./fold-block-weights.js";
import { growBlockSlices } from "./grow-block-slices.js";
import type { FtrlRule } from "./head-block.js";
import type { HeadRunner } from "./head-runner.js";
import type { HeadBatch } from "./head-setup.js";
import type { HeadState } from "./head-state.js";
import type { HeadWorkerData, HeadWorkerMessage, HeadWorkerReply } from "./head-worker.js";
import { makeFtrlRule } from "./make-ftrl-rule.js";
import { makeTrainingBlocks } from "./make-training-blocks.js";
import { mergeTrainingBlocks } from "./merge-training-blocks.js";
import { SharedBatchBuffers } from "./shared-batch-buffers.js";
import { copyMarkedPages, settleSimdMerge } from "./simd/merge-simd-head-block.js";

/** Whether workers get their own copies of their heads' arrays under trainHeadBlock: measured in bench/heads.ts. */
export const SEPARATE_BLOCKS = true;

/**
 * Trains heads on worker threads, each owning a block of heads in shared memory,
 * and optionally on the calling thread too (the last block, trained inside
 * submit). One batch is in flight at a time, in one of two shared buffers, so
 * the caller reads and encodes the next batch while the workers train on this
 * one. Every head sees the same rows in the same order as on one thread, so
 * results are bit for bit those of InlineHeadRunner.
 *
 * @example
 * const runner = WorkerHeadRunner.start(state, 2);
 * await runner.submit(batch, state.rowCount, maxRowLength);
 * await runner.drain(); // state.z and state.n are current
 * await runner.close();
 */
export class WorkerHeadRunner implements HeadRunner {
  private readonly state: HeadState;
  private readonly blocks: TrainingBlock[];
  private readonly workers: WorkerChannel[];
  /** The calling thread's own block (the last), or null. */
  private readonly local: BlockTrainer | null;
  private readonly rule: FtrlRule;
  private readonly buffers = [new SharedBatchBuffers(), new SharedBatchBuffers()];
  private turn = 0;
  private inflight: Promise<unknown> = Promise.resolve();

  private constructor(state: HeadState, blocks: TrainingBlock[], callerTrains: boolean) {
    this.state = state;
    this.blocks = blocks;
    const rule = makeFtrlRule(state.info);
    this.rule = rule;
    const onWorkers = callerTrains && blocks.length > 1 ? blocks.length - 1 : blocks.length;
    this.workers = blocks.slice(0, onWorkers).map((block) => new WorkerChannel({ block, rule }));
    this.local = onWorkers < blocks.length ? new BlockTrainer(blocks[onWorkers], rule) : null;
  }

  /**
   * Splits the heads into min(threads, heads) blocks (or more, if the
   * WebAssembly kernel needs them) and starts a worker per block, or per block
   * but the last with `callerTrains` (the calling thread trains that one);
   * `copies` matters only for the "js" kernel (see splitHeadBlocks).
   */
  static start(
    state: HeadState,
    threads: number,
    copies = SEPARATE_BLOCKS,
    kernel: HeadKernelChoice = "simd",
    callerTrains = false,
  ): WorkerHeadRunner {
    const groups = Math.min(threads, state.headCount);
    const blocks = makeTrainingBlocks(state, groups, kernel, copies);
    return new WorkerHeadRunner(state, blocks, callerTrains);
  }

  async submit(batch: HeadBatch, rowBase: number, maxRowLength: number): Promise<void> {
    const buffers = this.buffers[this.turn];
    this.turn ^= 1;
    const kernelBatch = buffers.fill(batch, this.state.headCount, rowBase, maxRowLength);
    const stats = this.state.progressive;
    if (batch.timestamps !== null) {
      stats.assignSlots(batch.timestamps, batch.encoded.rowCount, buffers.slots);
    }
    await this.inflight;
    const moved = growBlockSlices(this.state, this.blocks);
    this.inflight = Promise.all(
      this.workers.map((worker, b) => worker.run({ batch: kernelBatch, sliceStats: moved[b] })),
    );
    // A failure surfaces at the next await of `inflight`, not as an unhandled rejection.
    this.inflight.catch(() => undefined);
    if (this.local !== null) {
      const own = moved[this.workers.length];
      if (own !== null) this.local.useSliceStats(own);
      this.local.train(kernelBatch);
    }
  }

  fold(share: number): Promise<void> {
    // Queued behind the batch in flight rather than awaited, so the caller
    // encodes the next batch while the workers train and fold.
    const fold = weightFold(this.state, share);
    this.inflight = this.inflight.then(() =>
      Promise.all(this.workers.map((worker) => worker.run({ fold }))),
    );
    this.inflight.catch(() => undefined);
    if (this.local !== null) foldBlockWeights(this.blocks[this.workers.length], this.rule, fold);
    return Promise.resolve();
  }

  async drain(): Promise<void> {
    await this.inflight;
    const simd = this.blocks.filter(isSimdBlock);
    if (simd.length < this.blocks.length || this.workers.length === 0) {
      mergeTrainingBlocks(this.state, this.blocks);
      return;
    }
    // Every thread copies a share of the pages: first writes to the state's
    // arrays fault in fresh memory, slow enough on some machines to matter.
    const { state } = this;
    const pages = state.writtenPages.length;
    const shares = this.workers.length + 1;
    const bound = (i: number): number => Math.floor((pages * i) / shares);
    const heads = state.headCount;
    const copyShare = (i: number): void => {
      for (const block of simd) {
        copyMarkedPages(block, state.z, state.n, heads, bound(i), bound(i + 1));
      }
    };
    // A worker that died since its last batch has left that batch in shared
    // memory: its share is copied here, and its failure surfaces at the next batch.
    const copies = this.workers.map((worker, i) =>
      worker
        .run({
          merge: {
            blocks: simd,
            z: state.z,
            n: state.n,
            heads,
            fromPage: bound(i),
            toPage: bound(i + 1),
          },
        })
        .catch(() => copyShare(i)),
    );
    copyShare(shares - 1);
    await Promise.all(copies);
    for (const block of simd) settleSimdMerge(state, block);
  }

  async close(): Promise<void> {
    await this.inflight.catch(() => undefined);
    await Promise.all(this.workers.map((worker) => worker.terminate()));
  }
}

/** One worker thread and the batch it is working on. */
class WorkerChannel {
  private readonly worker: Worker;
  private pending: { resolve: () => void; reject: (error: Error) => void } | null = null;
  private failure: Error | null = null;

  constructor(data: HeadWorkerData) {
    // From dist the worker is compiled JavaScript; from the .ts sources (vitest,
    // tsx) a small module registers tsx in the worker first.
    const fromSource = import.meta.url.endsWith(".ts");
    const entry = fromSource ? "./head-worker-from-source.mjs" : "./head-worker.js";
    this.worker = new Worker(new URL(entry, import.meta.url), { workerData: data });
    this.worker.on("message", (reply: HeadWorkerReply) => {
      if ("error" in reply) this.settle(workerError(reply.error));
      else this.settle(null);
    });
    this.worker.on("error", (error) => this.settle(workerError(error.message)));
    // Also while idle: the next batch must fail at once, not wait for an answer that never comes.
    this.worker.on("exit", (code) => this.settle(workerError(`worker exited with code ${code}`)));
  }

  run(message: HeadWorkerMessage): Promise<void> {
    if (this.failure !== null) return Promise.reject(this.failure);
    return new Promise((resolve, reject) => {
      this.pending = { resolve, reject };
      this.worker.postMessage(message);
    });
  }

  async terminate(): Promise<void> {
    await this.worker.terminate();
  }

  private settle(error: Error | null): void {
    const pending = this.pending;
    this.pending = null;
    if (error !== null) this.failure ??= error;
    if (pending === null) return;
    if (error === null) pending.resolve();
    else pending.reject(error);
  }
}

function workerError(message: string): Error {
  return new LeafcastError("heads", [
    { code: "worker_failed", message: `a head-training worker failed: ${message}` },
  ]);
}
