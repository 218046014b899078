// Entry of the Plotline generator's worker thread when Leafcast runs from its
// TypeScript sources (vitest, tsx); compiled runs start plotline-worker.js
// directly. The worker registers tsx's loader itself (Node 20 does not pass the
// parent's `--import tsx` on to workers), then loads the real entry.
import { register } from "tsx/esm/api";

register();
await import("./plotline-worker.ts");
