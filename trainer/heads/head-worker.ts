/**
 * Worker-thread entry: owns one block of heads (arrays in shared memory, from
 * workerData) and trains it on each batch the main thread posts, copies its
 * share of a merge, or folds its weights into the moving average, answering
 * `{ ok: true }` or `{ error }` per message. Started by WorkerHeadRunner.
 */
import { parentPort, workerData } from "node:worker_threads";
import { BlockTrainer, type TrainingBlock } from "./block-trainer.js";
import { foldBlockWeights, type WeightFold } from "./fold-block-weights.js";
import type { FtrlRule, KernelBatch } from "./head-block.js";
import { copyMarkedPages } from "./simd/merge-simd-head-block.js";
import type { SimdHeadBlock } from "./simd/simd-head-block.js";

/** What the main thread posts per batch; `sliceStats` replaces the block's when the slices outgrew it. */
export interface HeadTrainMessage {
  readonly batch: KernelBatch;
  readonly sliceStats: Float64Array | null;
}

/** A share of a merge: copy the marked pages [fromPage, toPage) of every block into z and n. */
export interface HeadMergeMessage {
  readonly merge: {
    readonly blocks: readonly SimdHeadBlock[];
    readonly z: Float64Array;
    readonly n: Float64Array;
    readonly heads: number;
    readonly fromPage: number;
    readonly toPage: number;
  };
}

/** Fold the block's latest weights into the shared average (see fold-block-weights.ts). */
export interface HeadFoldMessage {
  readonly fold: WeightFold;
}

export type HeadWorkerMessage = HeadTrainMessage | HeadMergeMessage | HeadFoldMessage;

/** The worker's answer to one message. */
export type HeadWorkerReply = { readonly ok: true } | { readonly error: string };

/** Passed as workerData. */
export interface HeadWorkerData {
  readonly block: TrainingBlock;
  readonly rule: FtrlRule;
}

const port = parentPort;
if (port !== null) {
  const data = workerData as HeadWorkerData;
  const trainer = new BlockTrainer(data.block, data.rule);
  port.on("message", (message: HeadWorkerMessage) => {
    let reply: HeadWorkerReply;
    try {
      if ("fold" in message) {
        foldBlockWeights(data.block, data.rule, message.fold);
      } else if ("merge" in message) {
        const { blocks, z, n, heads, fromPage, toPage } = message.merge;
        for (const block of blocks) copyMarkedPages(block, z, n, heads, fromPage, toPage);
      } else {
        if (message.sliceStats !== null) trainer.useSliceStats(message.sliceStats);
        trainer.train(message.batch);
      }
      reply = { ok: true };
    } catch (error) {
      reply = { error: error instanceof Error ? (error.stack ?? error.message) : String(error) };
    }
    port.postMessage(reply);
  });
}
