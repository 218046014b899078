import { addTreeToScores } from "./add-tree-to-scores.js";
import { accumulateHistogram } from "./histogram-kernel.js";
import { logLossGradients } from "./log-loss-gradients.js";
import { partitionRows } from "./partition-rows.js";
import { TreeKernel } from "./simd/tree-kernel.js";
import type { TrainingBuffers } from "./training-buffers.js";
import { TreeTaskOp } from "./tree-task-op.js";

/**
 * Runs one round's records (see tree-task-op.ts) over the shared buffers. The
 * same function runs in every worker thread and, with one worker, on the main
 * thread, so the arithmetic is the same code either way. `scratch` is the
 * calling thread's own buffers for partitions (see createTaskScratch), with its
 * instance of the WebAssembly kernel when buffers.memory is set: histograms,
 * partitions, traversals and unweighted gradients then run there, the same bits
 * as the JavaScript kernels (which run otherwise, and for weighted gradients).
 *
 * Without `claim` the thread runs every record in order. With it, threads share
 * the round: each takes the next record of claim.order (record offsets into
 * `ints`) by an atomic increment of claim.next[0] until none is left, so a thread
 * that the machine slows down simply takes fewer records. Records write disjoint
 * memory, so who runs which never changes a bit of the result.
 *
 * @example
 * runTreeTasks(buffers, TreeTaskOp.gradients, Int32Array.of(6, 1000, 0, 1000, 0, -1, -1, -1), createTaskScratch(buffers));
 */
export function runTreeTasks(
  b: TrainingBuffers,
  op: number,
  ints: Int32Array,
  scratch: TaskScratch,
  claim: TaskClaim | null = null,
): void {
  if (claim === null) {
    for (let at = 0; at < ints.length; at += 2 + ints[at]) runTreeTask(b, op, ints, at, scratch);
    return;
  }
  const { next, order } = claim;
  for (let k = Atomics.add(next, 0, 1); k < order.length; k = Atomics.add(next, 0, 1)) {
    runTreeTask(b, op, ints, order[k], scratch);
  }
}

/** Rows per piece of a gradient record: its pairs and bins are still in cache for the histogram. */
const GRADIENT_PIECE_ROWS = 4096;

/** Records shared by the threads of one round (see runTreeTasks). */
export interface TaskClaim {
  /** A shared counter: the index in `order` of the next record to take. */
  readonly next: Int32Array;
  /** Offsets of the round's records in `ints`, the costliest first. */
  readonly order: Int32Array;
}

/** Runs the record that starts at offset `start` of `ints` (it ends before `at`). */
function runTreeTask(
  b: TrainingBuffers,
  op: number,
  ints: Int32Array,
  start: number,
  scratch: TaskScratch,
): void {
  const size = ints[start];
  const f = start + 2;
  const at = f + size;
  switch (op) {
    case TreeTaskOp.gradients: {
      // [start, end, sumsSlot, position, histSlot, treeDepth]
      const slot = 4 * ints[f + 2];
      b.sums.fill(0, slot, slot + 4);
      const position = ints[f + 3];
      const histSlot = ints[f + 4];
      const depth = ints[f + 5];
      const hist =
        histSlot < 0
          ? null
          : b.blockHist.subarray(b.histSize * histSlot, b.histSize * (histSlot + 1));
      if (hist !== null) hist.fill(0);
      // In pieces that stay in cache: the last tree's leaf values, the gradients from
      // the new scores, then (packed) the rows' bins and, with a histogram slot, the
      // next tree's root histogram over the pairs just written.
      let packed = position;
      for (let s = ints[f]; s < ints[f + 1]; s += GRADIENT_PIECE_ROWS) {
        const e = Math.min(s + GRADIENT_PIECE_ROWS, ints[f + 1]);
        if (depth >= 0 && scratch.kernel !== null) {
          scratch.kernel.traverse(
            b.bins.byteOffset,
            b.columnCount,
            s,
            e,
            depth,
            b.nodeColumn.byteOffset,
            b.goesRight.byteOffset,
            b.leafValue.byteOffset,
            b.score.byteOffset,
          );
        } else if (depth >= 0) {
          addTreeToScores(
            b.bins,
            b.columnCount,
            s,
            e,
            depth,
            b.nodeColumn,
            b.goesRight,
            b.leafValue,
            b.score,
          );
        }
        const from = packed;
        const out = position < 0 ? b.gradHess : b.ordered;
        const kernelGradients = b.weight === null ? (scratch.kernel?.gradients ?? null) : null;
        packed =
          kernelGradients !== null
            ? kernelGradients(
                b.score.byteOffset,
                b.label.byteOffset,
                b.validation === null ? 0 : b.validation.byteOffset,
                out.byteOffset,
                packed,
                s,
                e,
                b.sums,
                slot,
              )
            : logLossGradients(
                b.score,
                b.label,
                b.weight,
                b.validation,
                out,
                packed,
                s,
                e,
                b.sums,
                slot,
              );
        if (position < 0) continue;
        packTrainingRows(b, scratch.binWords, s, e, from);
        if (hist !== null) sumHistogram(b, scratch.kernel, from, packed, hist);
      }
      break;
    }
    case TreeTaskOp.partition: {
      // [histSlot, smallerSide, column, node, countSlot, start0, end0, ...]
      const slot = ints[f];
      const right = ints[f + 1];
      const hist =
        slot < 0 ? null : b.blockHist.subarray(b.histSize * slot, b.histSize * (slot + 1));
      if (hist !== null) hist.fill(0);
      let countSlot = ints[f + 4];
      for (let s = f + 5; s < at; s += 2) {
        const start = ints[s];
        const end = ints[s + 1];
        const left = partitionSegment(b, scratch, start, end, ints[f + 2], ints[f + 3]);
        b.counts[countSlot++] = left;
        // The smaller child's block histogram while the segment is still in cache.
        if (hist !== null) {
          const from = right === 0 ? start : start + left;
          const to = right === 0 ? start + left : end;
          sumHistogram(b, scratch.kernel, from, to, hist);
        }
      }
      break;
    }
    case TreeTaskOp.histogram: {
      const base = b.histSize * ints[f];
      const hist = b.blockHist.subarray(base, base + b.histSize);
      hist.fill(0);
      for (let s = f + 1; s < at; s += 2) {
        sumHistogram(b, scratch.kernel, ints[s], ints[s + 1], hist);
      }
      break;
    }
    case TreeTaskOp.place:
      placeRows(b, scratch.binWords, ints[f], ints[f + 1], ints[f + 2] === 1);
      break;
    default:
      throw new Error(`trees: unknown task op ${op}`);
  }
}

/** A thread's own partition buffers (gradient pairs and placed bins of one segment). */
export interface TaskScratch {
  readonly gradients: Float64Array;
  readonly words: Uint32Array;
  /** buffers.bins as 32-bit words when its rows are whole words (a view, not a copy). */
  readonly binWords: Uint32Array | null;
  /** This thread's instance of the WebAssembly kernel over buffers.memory (null without one). */
  readonly kernel: TreeKernel | null;
}

/**
 * partitionRows of one node segment (its split table is node's 256 bytes of
 * b.goesRight): with the WebAssembly kernel when the thread has one for these
 * rows, else in JavaScript; the same bytes either way. Returns the left rows.
 */
function partitionSegment(
  b: TrainingBuffers,
  scratch: TaskScratch,
  start: number,
  end: number,
  column: number,
  node: number,
): number {
  const partition = scratch.kernel?.partition ?? null;
  if (partition !== null) {
    const table = b.goesRight.byteOffset + 256 * node;
    return partition(b.placed.byteOffset, b.ordered.byteOffset, start, end, column, table) - start;
  }
  return partitionRows(
    b.placed,
    b.placedWords,
    b.placedStride,
    b.ordered,
    start,
    end,
    column,
    b.goesRight,
    256 * node,
    scratch.gradients,
    scratch.words,
  );
}

/**
 * Adds positions start .. end - 1 to `hist` (a block of b.blockHist): with the
 * WebAssembly kernel when the thread has one, else accumulateHistogram; both
 * give the same bits.
 */
function sumHistogram(
  b: TrainingBuffers,
  kernel: TreeKernel | null,
  start: number,
  end: number,
  hist: Float64Array,
): void {
  if (kernel !== null) {
    const { placed, ordered } = b;
    kernel.histogram(
      placed.byteOffset,
      b.placedStride,
      b.columnCount,
      start,
      end,
      ordered.byteOffset,
      hist.byteOffset,
    );
    return;
  }
  accumulateHistogram(b.placed, b.placedStride, b.columnCount, start, end, b.ordered, hist);
}

/**
 * Allocates a thread's partition buffers for segments of up to buffers.blockRows rows
 * and, over buffers.memory, its WebAssembly kernel (whose partitions have scratch
 * of their own in that memory; the JavaScript scratch is then left empty).
 *
 * @example
 * const scratch = createTaskScratch(buffers);
 */
export function createTaskScratch(buffers: TrainingBuffers): TaskScratch {
  const bins = buffers.bins;
  const wordRows = buffers.columnCount % 4 === 0 && bins.byteOffset % 4 === 0;
  const kernel =
    buffers.memory === null
      ? null
      : new TreeKernel(buffers.memory, buffers.blockRows, buffers.placedStride);
  const rows = kernel !== null && kernel.partition !== null ? 0 : buffers.blockRows;
  return {
    gradients: new Float64Array(2 * rows),
    words: new Uint32Array((rows * buffers.placedStride) / 4),
    binWords: wordRows ? new Uint32Array(bins.buffer, bins.byteOffset, bins.length >> 2) : null,
    kernel,
  };
}

/**
 * Writes the bins of the training rows among start .. end - 1, in row order, to
 * b.placed from `position` on: the next tree's root, whose gradient pairs
 * logLossGradients has just packed to the same positions. Kernel.
 */
function packTrainingRows(
  b: TrainingBuffers,
  binWords: Uint32Array | null,
  start: number,
  end: number,
  position: number,
): void {
  const { bins, placed, placedWords, columnCount, placedStride, validation } = b;
  if (validation === null && binWords !== null) {
    // Every row trains and rows are whole words: copy the block as it is.
    const w = columnCount >> 2;
    placedWords.set(binWords.subarray(start * w, end * w), position * w);
    return;
  }
  let p = position;
  for (let r = start; r < end; r++) {
    if (validation !== null && validation[r] === 1) continue;
    const from = r * columnCount;
    const to = p * placedStride;
    for (let c = 0; c < columnCount; c++) placed[to + c] = bins[from + c];
    p++;
  }
}

/**
 * Copies the bins of rows[start .. end) to their positions in b.placed and, with
 * `gradients`, their pairs from b.gradHess to b.ordered. Kernel.
 */
function placeRows(
  b: TrainingBuffers,
  binWords: Uint32Array | null,
  start: number,
  end: number,
  gradients: boolean,
): void {
  const { rows, bins, placed, placedWords, columnCount, placedStride } = b;
  if (binWords !== null) {
    // Row bytes are whole words in both arrays (columnCount is a multiple of 4).
    const w = columnCount >> 2;
    for (let i = start; i < end; i++) {
      const from = rows[i] * w;
      const to = i * w;
      for (let k = 0; k < w; k++) placedWords[to + k] = binWords[from + k];
    }
  } else {
    for (let i = start; i < end; i++) {
      const from = rows[i] * columnCount;
      const to = i * placedStride;
      for (let c = 0; c < columnCount; c++) placed[to + c] = bins[from + c];
    }
  }
  if (!gradients) return;
  const { gradHess, ordered } = b;
  for (let i = start; i < end; i++) {
    const r = rows[i];
    ordered[2 * i] = gradHess[2 * r];
    ordered[2 * i + 1] = gradHess[2 * r + 1];
  }
}
