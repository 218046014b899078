// Entry of a head-training worker thread when Leafcast runs from its TypeScript
// sources (vitest, tsx); compiled runs start head-worker.js directly. Node 20 does
// not apply `--import tsx` passed in a worker's execArgv unless the parent already
// runs under tsx, so the worker registers tsx's loader itself, then loads the
// real entry.
import process from "node:process";
import { setTimeout } from "node:timers";
import { parentPort } from "node:worker_threads";
import { register } from "tsx/esm/api";

// Tests only (this file never ships in dist): LEAFCAST_TEST_HEAD_WORKER_FAULT =
// "<kind>:<batch>" makes the worker fail on its n-th batch, to check that the
// main thread reports it and does not hang. Kinds: "throw" (training throws),
// "crash" (an uncaught exception), "exit" (process.exit(3) mid-batch),
// "exit-after" (exits just after answering; on a batch that ends at a
// checkpoint, the main thread is busy saving and sees the exit while idle).
const fault = /^(throw|crash|exit|exit-after):(\d+)$/.exec(
  process.env.LEAFCAST_TEST_HEAD_WORKER_FAULT ?? "",
);
if (fault !== null && parentPort !== null) {
  const [, kind, at] = fault;
  let batches = 0;
  const inject = (message, listener) => {
    batches++;
    if (batches !== Number(at)) return listener(message);
    if (kind === "throw") message.batch = null;
    else if (kind === "crash") throw new Error("injected head-worker crash");
    else if (kind === "exit") process.exit(3);
    listener(message);
    // After the answer is posted: the main thread sees the exit while idle.
    if (kind === "exit-after") setTimeout(() => process.exit(0), 2);
  };
  // The fault runs inside the real entry's own listener: a listener of our own
  // would start the port before the entry listens, and the entry would miss
  // the first batch.
  const on = parentPort.on.bind(parentPort);
  parentPort.on = (event, listener) =>
    on(event, event === "message" ? (message) => inject(message, listener) : listener);
}

register();
await import("./head-worker.ts");
