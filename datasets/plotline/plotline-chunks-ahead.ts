import { availableParallelism } from "node:os";
import { Worker } from "node:worker_threads";
import { LeafcastError } from "../../trainer/errors.js";
import { generatePlotline, type PlotlineChunk } from "./generate-plotline.js";
import { resolvePlotlineOptions, type PlotlineOptions } from "./plotline-options.js";
import type { PlotlineWorkerData, PlotlineWorkerReply } from "./plotline-worker.js";

/** Below this many rows the workers' start-up (~40 ms) costs more than it saves. */
const WORKER_MIN_ROWS = 200_000;

/**
 * Generating workers used by default: one beside the writing thread on two
 * cores, two from four cores up. Measured on the 2-core machine writing 3M rows
 * of CSV (chunks of 16,384 rows): one worker 491-541k rows/s at 2.8-3.2 CPU us
 * a row, two workers 397-451k at 3.9-4.5 (three busy threads on two cores evict
 * each other's caches), all on the calling thread 386-396k at 2.5.
 */
export const DEFAULT_GENERATING_WORKERS = Math.min(2, Math.max(1, availableParallelism() - 1));

/**
 * Whether plotlineChunksAhead generates these options on worker threads.
 *
 * @example
 * generatesOnWorker({ rows: 5_000_000 }); // true
 */
export function generatesOnWorker(options: PlotlineOptions): boolean {
  return resolvePlotlineOptions(options).rows >= WORKER_MIN_ROWS;
}

/**
 * The chunks of generatePlotline, in order, generated on `threads` worker
 * threads that take turns (chunk c on worker c % threads) and work up to `ahead`
 * chunks each before the caller asks for them, so that generating and writing
 * (about 1.3 and 1.2 us a row of CSV) run on different cores. The rows are
 * exactly those of generatePlotline (each worker runs it for its share). Every
 * chunk has fresh arrays the caller may keep. Small runs are generated on the
 * calling thread.
 *
 * @example
 * await writeDataFile("plotline.csv", "csv", columns, plotlineChunksAhead({ rows: 5e6 }));
 */
export async function* plotlineChunksAhead(
  options: PlotlineOptions = {},
  threads = DEFAULT_GENERATING_WORKERS,
  ahead = 3,
): AsyncGenerator<PlotlineChunk> {
  if (!generatesOnWorker(options)) {
    yield* generatePlotline(options, false);
    return;
  }
  const workers: ChunkWorker[] = [];
  try {
    // Started inside the try, so that one failing to start stops the others.
    for (let index = 0; index < threads; index++) {
      workers.push(new ChunkWorker({ options, share: { index, of: threads } }, ahead));
    }
    for (let c = 0; ; c++) {
      const chunk = await workers[c % threads].next();
      if (chunk === null) return;
      yield chunk;
    }
  } finally {
    await Promise.all(workers.map((worker) => worker.stop()));
  }
}

/** One generating worker and the chunks it has sent but the caller has not taken. */
class ChunkWorker {
  private readonly worker: Worker;
  private readonly received: PlotlineWorkerReply[] = [];
  private wake: (() => void) | null = null;

  constructor(data: PlotlineWorkerData, ahead: number) {
    // From dist the worker is compiled JavaScript; from the .ts sources (vitest,
    // tsx) a small module registers tsx in the worker first.
    const fromSource = import.meta.url.endsWith(".ts");
    const entry = fromSource ? "./plotline-worker-from-source.mjs" : "./plotline-worker.js";
    this.worker = new Worker(new URL(entry, import.meta.url), { workerData: data });
    this.worker.on("message", (reply: PlotlineWorkerReply) => this.arrive(reply));
    this.worker.on("error", (error) => this.arrive({ error: error.stack ?? error.message }));
    this.worker.on("exit", (code) => this.arrive({ error: `the worker exited with code ${code}` }));
    this.worker.postMessage(ahead);
  }

  /** The worker's next chunk, or null after its last. */
  async next(): Promise<PlotlineChunk | null> {
    while (this.received.length === 0) {
      await new Promise<void>((resolve) => (this.wake = resolve));
    }
    const reply = this.received.shift() as PlotlineWorkerReply;
    if ("done" in reply) return null;
    if ("error" in reply) {
      throw new LeafcastError("scenario", [
        { code: "worker_failed", message: `generating rows failed: ${reply.error}` },
      ]);
    }
    this.worker.postMessage(1);
    return reply.chunk;
  }

  async stop(): Promise<void> {
    this.worker.removeAllListeners("exit");
    await this.worker.terminate();
  }

  private arrive(reply: PlotlineWorkerReply): void {
    this.received.push(reply);
    this.wake?.();
    this.wake = null;
  }
}
