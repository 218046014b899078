import { Worker } from "node:worker_threads";
import { LeafcastError } from "../../trainer/errors.js";
import { generatePlotline, type PlotlineChunk } from "./generate-plotline.js";
import { resolvePlotlineOptions, type PlotlineOptions } from "./plotline-options.js";
import type { PlotlineWorkerReply } from "./plotline-worker.js";

/** Below this many rows a worker's start-up (~40 ms) costs more than it saves. */
const WORKER_MIN_ROWS = 200_000;

/**
 * Whether plotlineChunksAhead generates these options on a worker thread.
 *
 * @example
 * generatesOnWorker({ rows: 5_000_000 }); // true
 */
export function generatesOnWorker(options: PlotlineOptions): boolean {
  return resolvePlotlineOptions(options).rows >= WORKER_MIN_ROWS;
}

/**
 * The chunks of generatePlotline, generated on a worker thread up to `ahead`
 * chunks before the caller asks for them, so that generating and writing (each
 * about half the cost of a row of CSV) run on two cores at once. The rows are
 * exactly those of generatePlotline: the worker runs it. Every chunk has fresh
 * arrays the caller may keep. Small runs are generated on the calling thread.
 *
 * @example
 * await writeDataFile("plotline.csv", "csv", columns, plotlineChunksAhead({ rows: 5e6 }));
 */
export async function* plotlineChunksAhead(
  options: PlotlineOptions = {},
  ahead = 4,
): AsyncGenerator<PlotlineChunk> {
  if (!generatesOnWorker(options)) {
    yield* generatePlotline(options, false);
    return;
  }
  // From dist the worker is compiled JavaScript; from the .ts sources (vitest,
  // tsx) a small module registers tsx in the worker first.
  const fromSource = import.meta.url.endsWith(".ts");
  const entry = fromSource ? "./plotline-worker-from-source.mjs" : "./plotline-worker.js";
  const worker = new Worker(new URL(entry, import.meta.url), { workerData: options });
  const received: PlotlineWorkerReply[] = [];
  let wake: (() => void) | null = null;
  const arrive = (reply: PlotlineWorkerReply): void => {
    received.push(reply);
    wake?.();
    wake = null;
  };
  worker.on("message", arrive);
  worker.on("error", (error) => arrive({ error: error.stack ?? error.message }));
  worker.on("exit", (code) => arrive({ error: `the generator's worker exited with code ${code}` }));
  try {
    worker.postMessage(ahead);
    while (true) {
      while (received.length === 0) await new Promise<void>((resolve) => (wake = resolve));
      const reply = received.shift() as PlotlineWorkerReply;
      if ("done" in reply) return;
      if ("error" in reply) {
        throw new LeafcastError("scenario", [
          { code: "worker_failed", message: `generating rows failed: ${reply.error}` },
        ]);
      }
      worker.postMessage(1);
      yield reply.chunk;
    }
  } finally {
    worker.removeAllListeners("exit");
    await worker.terminate();
  }
}
