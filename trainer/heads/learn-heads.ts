import { availableParallelism } from "node:os";
import { CheckpointSchedule } from "../io/checkpoint-schedule.js";
import type { HeadAveraging } from "../schema/load-training-config.js";
import { checkHeadBatch } from "./check-head-batch.js";
import { checkResume } from "./check-resume.js";
import type { HeadKernelChoice } from "./block-trainer.js";
import type { HeadRunner } from "./head-runner.js";
import type { HeadBatch, HeadSetup } from "./head-setup.js";
import { HeadState } from "./head-state.js";
import { InlineHeadRunner } from "./inline-head-runner.js";
import { sliceHeadBatch } from "./slice-head-batch.js";
import { snapshotShare } from "./weight-average.js";
import { SEPARATE_BLOCKS, WorkerHeadRunner } from "./worker-head-runner.js";

/**
 * Worker threads used when the caller does not say: one per core. Measured with
 * `npm run bench:heads` (2-core machine, load ~1.7, WebAssembly kernel): one
 * thread 188k rows/s; one worker 235k; two workers 238-251k, at 6.6-7.0 CPU us
 * per row against 5.4 on one thread.
 */
export const DEFAULT_HEAD_WORKERS = Math.max(1, availableParallelism());

/**
 * Whether the calling thread trains a block of heads beside the workers. In
 * bench:heads (encoding only on the calling thread) it measured 0.5-1 % faster
 * than two workers, within the noise; with files to read and parse the calling
 * thread has more to do, so the default leaves training to the workers.
 */
export const CALLER_TRAINS = false;

export interface LearnHeadsOptions {
  /** A state to continue (checked against the setup first); it is advanced in place and returned. */
  readonly state?: HeadState;
  /** Worker threads, each owning some heads; 0 trains on the calling thread. Results are identical either way. */
  readonly workers?: number;
  /**
   * With workers: give each worker its own copy of its heads' arrays (no cache
   * line shared between threads, twice the memory) rather than views of the
   * state's. Default SEPARATE_BLOCKS, chosen with `npm run bench:heads`.
   */
  readonly workerCopies?: boolean;
  /**
   * "simd" (default): the WebAssembly kernel, on a copy of each thread's heads
   * in its layout, where that fits WebAssembly's 4 GiB (else "js"); "js": the
   * JavaScript kernel. Both give the same bits.
   */
  readonly kernel?: HeadKernelChoice;
  /**
   * With 2 or more workers: the calling thread trains one block of heads itself
   * between batches, so `workers` counts it and one fewer worker thread starts.
   * Default CALLER_TRAINS, chosen with `npm run bench:heads`.
   */
  readonly callerTrains?: boolean;
  /** Checkpoint after the batch in which the row count passes a multiple of this (0: never). */
  readonly everyRows?: number;
  /** Also checkpoint after the first batch that ends this many seconds after the last checkpoint (0: never). */
  readonly everySeconds?: number;
  /** Receives the up-to-date state at each checkpoint, e.g. to save it; awaited before training goes on. */
  readonly onCheckpoint?: (state: HeadState) => void | Promise<void>;
}

/**
 * Learns one FTRL-Proximal head per outcome over a stream of encoded batches, all
 * heads in one pass, scoring each row before training on it (progressive
 * validation) and downsampling negatives per head as the setup says. With
 * `options.state` it continues a saved state: the result is exactly that of one
 * uninterrupted run over all the rows, provided the new rows follow the old ones.
 * If it throws, a state passed in is left part-trained: reload it from its file.
 *
 * @example
 * const state = await learnHeads(encodedDays(files), setup, {
 *   everyRows: config.checkpoint.everyRows,
 *   onCheckpoint: (s) => saveHeadState("runs/demo/heads.state", s),
 * });
 * const heads = exportHeadModels(state);
 */
export async function learnHeads(
  batches: AsyncIterable<HeadBatch> | Iterable<HeadBatch>,
  setup: HeadSetup,
  options: LearnHeadsOptions = {},
): Promise<HeadState> {
  const state = options.state ?? HeadState.create(setup);
  if (options.state !== undefined) checkResume(options.state, setup);
  const workers = options.workers ?? DEFAULT_HEAD_WORKERS;
  const kernel = options.kernel ?? "simd";
  const everyRows = options.everyRows ?? 0;
  // Rows are counted from the state's own row count (so a resumed run keeps the same rhythm); the schedule only keeps time.
  const clock = new CheckpointSchedule(0, options.everySeconds ?? 0);
  const runner: HeadRunner =
    workers > 0
      ? WorkerHeadRunner.start(
          state,
          workers,
          options.workerCopies ?? SEPARATE_BLOCKS,
          kernel,
          options.callerTrains ?? CALLER_TRAINS,
        )
      : new InlineHeadRunner(state, kernel);
  let batchNumber = 0;
  try {
    for await (const batch of batches) {
      batchNumber++;
      const maxRowLength = checkHeadBatch(
        batch,
        state.headCount,
        state.info.indexSize,
        batchNumber,
      );
      const rows = batch.encoded.rowCount;
      if (rows === 0) continue;
      const before = state.rowCount;
      if (state.info.averaging === null) {
        await runner.submit(batch, before, maxRowLength);
        state.rowCount = before + rows;
      } else {
        await submitAveraged(runner, state, state.info.averaging, batch, maxRowLength);
      }
      if (batch.timestamps !== null) widenWindow(state, batch.timestamps, rows);
      const byRows =
        everyRows > 0 && Math.floor(state.rowCount / everyRows) > Math.floor(before / everyRows);
      const due = clock.advance(rows) || byRows;
      if (byRows) clock.reset();
      if (due && options.onCheckpoint !== undefined) {
        await runner.drain();
        await options.onCheckpoint(state);
      }
    }
    await runner.drain();
  } finally {
    await runner.close();
  }
  return state;
}

/**
 * Trains on a batch cut where the row count reaches a multiple of `everyRows`;
 * at each such row every thread folds its heads' latest weights into the moving
 * average. The cuts depend on the row count only, so a resumed run folds
 * exactly where an uninterrupted one does.
 */
async function submitAveraged(
  runner: HeadRunner,
  state: HeadState,
  averaging: HeadAveraging,
  batch: HeadBatch,
  maxRowLength: number,
): Promise<void> {
  const { everyRows } = averaging;
  const rows = batch.encoded.rowCount;
  for (let from = 0; from < rows;) {
    const snapshotRow = (Math.floor(state.rowCount / everyRows) + 1) * everyRows;
    const to = Math.min(rows, from + (snapshotRow - state.rowCount));
    const part = from === 0 && to === rows ? batch : sliceHeadBatch(batch, from, to);
    await runner.submit(part, state.rowCount, maxRowLength);
    state.rowCount += to - from;
    from = to;
    if (state.rowCount === snapshotRow) {
      const share = snapshotShare(everyRows, averaging.halfLifeRows);
      await runner.fold(share);
      state.averageMass += share * (1 - state.averageMass);
    }
  }
}

function widenWindow(state: HeadState, timestamps: Float64Array, rows: number): void {
  let first = state.firstTimestamp ?? Infinity;
  let last = state.lastTimestamp ?? -Infinity;
  for (let r = 0; r < rows; r++) {
    const t = timestamps[r];
    if (t < first) first = t;
    if (t > last) last = t;
  }
  if (first <= last) {
    state.firstTimestamp = first;
    state.lastTimestamp = last;
  }
}
