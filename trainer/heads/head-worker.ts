/**
 * Worker-thread entry: owns one block of heads (arrays in shared memory, from
 * workerData) and trains it on each batch the main thread posts, answering
 * `{ ok: true }` or `{ error }` per batch. Started by WorkerHeadRunner.
 */
import { parentPort, workerData } from "node:worker_threads";
import { BlockTrainer, type TrainingBlock } from "./block-trainer.js";
import type { FtrlRule, KernelBatch } from "./head-block.js";

/** What the main thread posts per batch; `sliceStats` replaces the block's when the slices outgrew it. */
export interface HeadWorkerMessage {
  readonly batch: KernelBatch;
  readonly sliceStats: Float64Array | null;
}

/** The worker's answer to one batch. */
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
      if (message.sliceStats !== null) trainer.useSliceStats(message.sliceStats);
      trainer.train(message.batch);
      reply = { ok: true };
    } catch (error) {
      reply = { error: error instanceof Error ? (error.stack ?? error.message) : String(error) };
    }
    port.postMessage(reply);
  });
}
