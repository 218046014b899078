/**
 * Worker-thread entry of the tree learner: receives the shared training buffers
 * and the pool's record counter once, then takes records of each round (see
 * runTreeTasks) until none is left and answers with "done", or with "failed"
 * and the error's text.
 */
import { parentPort } from "node:worker_threads";
import { createTaskScratch, runTreeTasks, type TaskScratch } from "./run-tree-tasks.js";
import type { TrainingBuffers } from "./training-buffers.js";
import type { PoolReply, PoolRequest } from "./tree-task-messages.js";

let buffers: TrainingBuffers | null = null;
let scratch: TaskScratch | null = null;
let next: Int32Array | null = null;

parentPort?.on("message", (message: PoolRequest) => {
  let reply: PoolReply;
  try {
    if (message.type === "init") {
      buffers = message.buffers;
      scratch = createTaskScratch(buffers);
      next = message.next;
      reply = { type: "done", round: -1 };
    } else {
      if (buffers === null || scratch === null || next === null) {
        throw new Error("trees: a task round arrived before the buffers");
      }
      runTreeTasks(buffers, message.op, message.ints, scratch, { next, order: message.order });
      reply = { type: "done", round: message.round };
    }
  } catch (error) {
    const text = error instanceof Error ? (error.stack ?? error.message) : String(error);
    reply = { type: "failed", round: message.type === "run" ? message.round : -1, message: text };
  }
  parentPort?.postMessage(reply);
});
