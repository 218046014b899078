// Entry of a head-training worker thread when Leafcast runs from its TypeScript
// sources (vitest, tsx); compiled runs start head-worker.js directly. Node 20 does
// not apply `--import tsx` passed in a worker's execArgv unless the parent already
// runs under tsx, so the worker registers tsx's loader itself, then loads the
// real entry.
import { register } from "tsx/esm/api";

register();
await import("./head-worker.ts");
