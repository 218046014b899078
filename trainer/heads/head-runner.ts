import type { HeadBatch } from "./head-setup.js";

/**
 * Runs the training kernels over batches for a head state, on the calling thread
 * or on worker threads; learnHeads drives it.
 */
export interface HeadRunner {
  /**
   * Trains on a checked batch whose first row has global number `rowBase`. It may
   * resolve before training ends (workers train while the caller reads and
   * encodes the next batch); the batch's arrays are copied or used before it resolves.
   */
  submit(batch: HeadBatch, rowBase: number, maxRowLength: number): Promise<void>;
  /**
   * Folds the heads' latest weights, as of every batch submitted so far, into
   * state.average with the given share (see fold-block-weights.ts); the state's
   * z and n need not be current. It may resolve before the fold ends; the
   * average is complete by the next drain.
   */
  fold(share: number): Promise<void>;
  /** Waits for every submitted batch and brings the state's arrays up to date. */
  drain(): Promise<void>;
  /** Drains and releases threads; the state is up to date afterwards. */
  close(): Promise<void>;
}
