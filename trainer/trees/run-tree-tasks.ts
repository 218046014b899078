import { accumulateHistogram } from "./histogram-kernel.js";
import { logLossGradients } from "./log-loss-gradients.js";
import { partitionRows } from "./partition-rows.js";
import { addLeafValue, addSplitValues, addTreeByTraversal } from "./score-kernels.js";
import type { TrainingBuffers } from "./training-buffers.js";
import { TreeTaskOp } from "./tree-task-op.js";

/**
 * Runs one round's records (see tree-task-op.ts) over the shared buffers. The
 * same function runs in every worker thread and, with one worker, on the main
 * thread, so the arithmetic is the same code either way. `scratch` is the
 * calling thread's own buffers for partitions (see createTaskScratch).
 *
 * @example
 * runTreeTasks(buffers, TreeTaskOp.gradients, Int32Array.of(3, 1000, 0, 1000, 0), null, createTaskScratch(buffers));
 */
export function runTreeTasks(
  b: TrainingBuffers,
  op: number,
  ints: Int32Array,
  scratch: TaskScratch,
): void {
  for (let at = 0; at < ints.length;) {
    const size = ints[at];
    const f = at + 2;
    at = f + size;
    switch (op) {
      case TreeTaskOp.gradients: {
        const slot = 4 * ints[f + 2];
        b.sums.fill(0, slot, slot + 4);
        logLossGradients(
          b.score,
          b.label,
          b.weight,
          b.validation,
          ints[f + 3] < 0 ? b.gradHess : b.ordered,
          ints[f + 3],
          ints[f],
          ints[f + 1],
          b.sums,
          slot,
        );
        break;
      }
      case TreeTaskOp.partition:
        b.counts[ints[f + 4]] = partitionRows(
          b.bins,
          b.columnCount,
          b.rows,
          b.ordered,
          ints[f],
          ints[f + 1],
          ints[f + 2],
          b.goesRight,
          256 * ints[f + 3],
          scratch.rows,
          scratch.gradients,
        );
        break;
      case TreeTaskOp.histogram: {
        const base = b.histSize * ints[f];
        const hist = b.blockHist.subarray(base, base + b.histSize);
        hist.fill(0);
        for (let s = f + 1; s < at; s += 2) {
          accumulateHistogram(b.bins, b.columnCount, b.rows, ints[s], ints[s + 1], b.ordered, hist);
        }
        break;
      }
      case TreeTaskOp.addLeaf:
        addLeafValue(b.rows, ints[f], ints[f + 1], b.score, b.nodeValue[ints[f + 2]]);
        break;
      case TreeTaskOp.traverse:
        addTreeByTraversal(
          b.bins,
          b.columnCount,
          b.otherRows,
          ints[f],
          ints[f + 1],
          ints[f + 2],
          b.nodeColumn,
          b.goesRight,
          b.leafValue,
          b.score,
        );
        break;
      case TreeTaskOp.addSplit:
        addSplitValues(
          b.bins,
          b.columnCount,
          b.rows,
          ints[f],
          ints[f + 1],
          ints[f + 2],
          ints[f + 3],
          b.goesRight,
          b.nodeValue,
          b.score,
        );
        break;
      case TreeTaskOp.order:
        orderGradients(b.rows, b.gradHess, b.ordered, ints[f], ints[f + 1]);
        break;
      default:
        throw new Error(`trees: unknown task op ${op}`);
    }
  }
}

/** A thread's own partition buffers: rows and gradient pairs of one segment. */
export interface TaskScratch {
  readonly rows: Uint32Array;
  readonly gradients: Float64Array;
}

/**
 * Allocates a thread's partition buffers for segments of up to buffers.blockRows rows.
 *
 * @example
 * const scratch = createTaskScratch(buffers);
 */
export function createTaskScratch(buffers: TrainingBuffers): TaskScratch {
  return {
    rows: new Uint32Array(buffers.blockRows),
    gradients: new Float64Array(2 * buffers.blockRows),
  };
}

/** ordered[2i], ordered[2i + 1] = the gradient pair of row rows[i]. Kernel. */
function orderGradients(
  rows: Uint32Array,
  gradHess: Float64Array,
  ordered: Float64Array,
  start: number,
  end: number,
): void {
  for (let i = start; i < end; i++) {
    const r = rows[i];
    ordered[2 * i] = gradHess[2 * r];
    ordered[2 * i + 1] = gradHess[2 * r + 1];
  }
}
