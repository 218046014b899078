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
 * thread when one worker is asked for. A round's records are spread over the
 * workers by row count; since records write disjoint memory, the result does
 * not depend on the spread. Always `close()` the pool (workers keep a process
 * alive); a worker that throws rejects the round with a LeafcastError.
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
      const init: PoolRequest = { type: "init", buffers };
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
    const parts = spreadRecords(ints, this.workerCount);
    const round = ++this.round;
    return new Promise<void>((resolve, reject) => {
      const pending: PendingRound = { round, waiting: 0, resolve, reject };
      this.pending = pending;
      parts.forEach((part, i) => {
        if (part.length === 0) return;
        pending.waiting++;
        const request: PoolRequest = { type: "run", round, op, ints: part };
        this.workers[i].postMessage(request);
      });
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

/** Splits records over `parts` workers, largest first onto the least-loaded one. */
function spreadRecords(ints: Int32Array, parts: number): Int32Array[] {
  const starts: number[] = [];
  for (let at = 0; at < ints.length; at += 2 + ints[at]) starts.push(at);
  const cost = (k: number): number => ints[starts[k] + 1];
  const order = starts.map((_, k) => k).sort((a, b) => cost(b) - cost(a) || a - b);
  const load = new Float64Array(parts);
  const owner = new Int32Array(starts.length);
  const length = new Int32Array(parts);
  for (const k of order) {
    let best = 0;
    for (let w = 1; w < parts; w++) if (load[w] < load[best]) best = w;
    owner[k] = best;
    load[best] += cost(k) + 64; // a record's fixed overhead, in rows
    length[best] += 2 + ints[starts[k]];
  }
  const out = Array.from({ length: parts }, (_, w) => new Int32Array(length[w]));
  const filled = new Int32Array(parts);
  starts.forEach((at, k) => {
    const w = owner[k];
    const size = 2 + ints[at];
    out[w].set(ints.subarray(at, at + size), filled[w]);
    filled[w] += size;
  });
  return out;
}
