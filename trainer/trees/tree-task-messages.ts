import type { TrainingBuffers } from "./training-buffers.js";

/** What the main thread posts to a tree worker. */
export type PoolRequest =
  | {
      readonly type: "init";
      readonly buffers: TrainingBuffers;
      /** The pool's shared record counter (one Int32 over a SharedArrayBuffer). */
      readonly next: Int32Array;
    }
  | {
      readonly type: "run";
      readonly round: number;
      readonly op: number;
      readonly ints: Int32Array;
      /** Offsets of the records in `ints`, in the order the threads take them. */
      readonly order: Int32Array;
    };

/** What a tree worker posts back: one reply per request. */
export type PoolReply =
  | { readonly type: "done"; readonly round: number }
  | { readonly type: "failed"; readonly round: number; readonly message: string };
