/**
 * Worker-thread entry of plotlineChunksAhead: runs generatePlotline for the
 * options and share in workerData and posts one chunk per credit the main
 * thread sends, its column buffers transferred (not copied), then
 * `{ done: true }`; a failure is posted as `{ error }`.
 */
import { parentPort, workerData } from "node:worker_threads";
import { generatePlotline, type PlotlineChunk, type PlotlineShare } from "./generate-plotline.js";
import type { PlotlineOptions } from "./plotline-options.js";

/** Passed as workerData. */
export interface PlotlineWorkerData {
  readonly options: PlotlineOptions;
  readonly share: PlotlineShare;
}

/** What the worker posts: a chunk, the end, or a failure. */
export type PlotlineWorkerReply =
  { readonly chunk: PlotlineChunk } | { readonly done: true } | { readonly error: string };

const port = parentPort;
if (port !== null) {
  const data = workerData as PlotlineWorkerData;
  const chunks = generatePlotline(data.options, false, data.share);
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
