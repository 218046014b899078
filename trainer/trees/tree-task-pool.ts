import { Worker } from "node:worker_threads";
import { LeafcastError } from "../errors.js";
import { createTaskScratch, runTreeTasks, type TaskScratch } from "./run-tree-tasks.js";
import type { TrainingBuffers } from "./training-buffers.js";
import type { PoolReply, PoolRequest } from "./tree-task-messages.js";

interface PendingRound {
  readonly round: number;
  waiting: number;
  readonly resolve: () => void;
  readonly reject: (error: unknown) => void;
}

/**
 * Runs rounds of tree tasks on worker threads over shared memory, or on the main
 * thread when one worker is asked for. Every worker gets the whole round and
 * takes its records one at a time, costliest first, from a shared counter (see
 * runTreeTasks): on a machine shared with other work a fixed spread left one
 * worker idle for a third of the time in a profile here, waiting for the other.
 * Records write disjoint memory, so the result does not depend on who ran what.
 * Always `close()` the pool (workers keep a process alive); a worker that throws
 * rejects the round with a LeafcastError.
 *
 * @example
 * const pool = new TreeTaskPool(buffers, 2);
 * try {
 *   await pool.run(TreeTaskOp.gradients, Int32Array.of(3, 50_000, 0, 50_000, 0));
 * } finally {
 *   await pool.close();
 * }
 */
export class TreeTaskPool {
  readonly workerCount: number;
  private readonly buffers: TrainingBuffers;
  private readonly scratch: TaskScratch | null;
  private readonly workers: Worker[] = [];
  /** The shared record counter of the current round. */
  private readonly next = new Int32Array(new SharedArrayBuffer(4));
  private pending: PendingRound | null = null;
  private broken: LeafcastError | null = null;
  private closing = false;
  private round = 0;

  constructor(buffers: TrainingBuffers, workers: number) {
    this.buffers = buffers;
    this.workerCount = Math.max(1, Math.floor(workers));
    this.scratch = this.workerCount === 1 ? createTaskScratch(buffers) : null;
    if (this.workerCount === 1) return;
    for (let i = 0; i < this.workerCount; i++) {
      const worker = startTreeWorker();
      worker.on("message", (reply: PoolReply) => this.onReply(i, reply));
      worker.on("error", (error: Error) => this.fail(i, error.stack ?? error.message));
      worker.on("exit", (code: number) => {
        if (!this.closing) this.fail(i, `exited unexpectedly with code ${code}`);
      });
      const init: PoolRequest = { type: "init", buffers, next: this.next };
      worker.postMessage(init);
      this.workers.push(worker);
    }
  }

  /** Runs one round: every record of `ints` exactly once. */
  run(op: number, ints: Int32Array): Promise<void> {
    if (this.broken !== null) return Promise.reject(this.broken);
    if (ints.length === 0) return Promise.resolve();
    if (this.scratch !== null) {
      try {
        runTreeTasks(this.buffers, op, ints, this.scratch);
        return Promise.resolve();
      } catch (error) {
        return Promise.reject(error);
      }
    }
    const order = recordOrder(ints);
    const helpers = Math.min(this.workerCount, order.length);
    const round = ++this.round;
    Atomics.store(this.next, 0, 0); // every worker has answered the previous round
    return new Promise<void>((resolve, reject) => {
      this.pending = { round, waiting: helpers, resolve, reject };
      for (let i = 0; i < helpers; i++) {
        const request: PoolRequest = { type: "run", round, op, ints, order };
        this.workers[i].postMessage(request);
      }
    });
  }

  /** Terminates the workers; safe to call twice. */
  async close(): Promise<void> {
    this.closing = true;
    const workers = this.workers.splice(0);
    await Promise.all(workers.map((worker) => worker.terminate()));
  }

  private onReply(worker: number, reply: PoolReply): void {
    if (reply.type === "failed") {
      this.fail(worker, reply.message);
      return;
    }
    const pending = this.pending;
    if (pending === null || reply.round !== pending.round) return; // "init" replies, or late ones
    if (--pending.waiting === 0) {
      this.pending = null;
      pending.resolve();
    }
  }

  private fail(worker: number, message: string): void {
    if (this.closing) return;
    const firstLine = message.split("\n")[0];
    const error = new LeafcastError("trees", [
      { code: "worker_failed", message: `worker thread ${worker + 1} failed: ${firstLine}` },
    ]);
    this.broken = error;
    const pending = this.pending;
    if (pending !== null) {
      this.pending = null;
      pending.reject(error);
    }
  }
}

/**
 * Starts one worker on the compiled script (dist) or, when this module runs as
 * TypeScript source (vitest, tsx), on the .ts script through tsx's loader. Node 20
 * does not apply `execArgv: ["--import", "tsx"]` to a worker's entry module (it
 * fails with "Unknown file extension .ts"), so the loader is registered by a
 * small bootstrap that then imports the entry.
 */
function startTreeWorker(): Worker {
  const here = import.meta.url;
  if (here.endsWith(".ts")) {
    const entry = new URL("./histogram-worker.ts", here).href;
    const bootstrap = `import("tsx/esm/api").then(({ register }) => { register(); return import(${JSON.stringify(entry)}); });`;
    return new Worker(bootstrap, { eval: true });
  }
  return new Worker(new URL("./histogram-worker.js", here));
}

/** Offsets of the records of `ints`, costliest first (ties in record order). */
function recordOrder(ints: Int32Array): Int32Array {
  const starts: number[] = [];
  for (let at = 0; at < ints.length; at += 2 + ints[at]) starts.push(at);
  starts.sort((a, b) => ints[b + 1] - ints[a + 1] || a - b);
  return Int32Array.from(starts);
}
