/**
 * Worker-thread entry: owns one block of heads (arrays in shared memory, from
 * workerData) and trains it on each batch the main thread posts, answering
 * `{ ok: true }` or `{ error }` per batch. Started by WorkerHeadRunner.
 */
import { parentPort, workerData } from "node:worker_threads";
import type { FtrlRule, HeadBlock, KernelBatch } from "./head-block.js";
import { trainHeadBlock } from "./train-head-block.js";

/** What the main thread posts per batch; `sliceStats` replaces the block's when the slices outgrew it. */
export interface HeadWorkerMessage {
  readonly batch: KernelBatch;
  readonly sliceStats: Float64Array | null;
}

/** The worker's answer to one batch. */
export type HeadWorkerReply = { readonly ok: true } | { readonly error: string };

/** Passed as workerData. */
export interface HeadWorkerData {
  readonly block: HeadBlock;
  readonly rule: FtrlRule;
}

const port = parentPort;
if (port !== null) {
  const data = workerData as HeadWorkerData;
  let block = data.block;
  port.on("message", (message: HeadWorkerMessage) => {
    let reply: HeadWorkerReply;
    try {
      if (message.sliceStats !== null) block = { ...block, sliceStats: message.sliceStats };
      trainHeadBlock(block, data.rule, message.batch);
      reply = { ok: true };
    } catch (error) {
      reply = { error: error instanceof Error ? (error.stack ?? error.message) : String(error) };
    }
    port.postMessage(reply);
  });
}
