/**
 * Worker-thread entry of plotlineChunksAhead: runs generatePlotline for the
 * options in workerData and posts one chunk per credit the main thread sends,
 * its column buffers transferred (not copied), then `{ done: true }`; a failure
 * is posted as `{ error }`.
 */
import { parentPort, workerData } from "node:worker_threads";
import { generatePlotline, type PlotlineChunk } from "./generate-plotline.js";
import type { PlotlineOptions } from "./plotline-options.js";

/** What the worker posts: a chunk, the end, or a failure. */
export type PlotlineWorkerReply =
  { readonly chunk: PlotlineChunk } | { readonly done: true } | { readonly error: string };

const port = parentPort;
if (port !== null) {
  const chunks = generatePlotline(workerData as PlotlineOptions, false);
  port.on("message", (credits: number) => {
    try {
      for (let c = 0; c < credits; c++) {
        const next = chunks.next();
        if (next.done === true) {
          port.postMessage({ done: true } satisfies PlotlineWorkerReply);
          return;
        }
        // generatePlotline allocates plain (not shared) buffers when not reusing arrays.
        const buffers = Object.values(next.value.columns).map(
          (values) => values.buffer as ArrayBuffer,
        );
        port.postMessage({ chunk: next.value } satisfies PlotlineWorkerReply, buffers);
      }
    } catch (error) {
      const message = error instanceof Error ? (error.stack ?? error.message) : String(error);
      port.postMessage({ error: message } satisfies PlotlineWorkerReply);
    }
  });
}
