import { EXP_NEG_POW2, EXP_NEG_STEP } from "../logistic-tables.js";
import { TREE_KERNEL_BASE64 } from "./tree-kernel.generated.js";
import { MAX_HISTOGRAM_COLUMNS, MAX_PARTITION_WORDS } from "./tree-kernel-wat.js";

type PartitionPass = (
  placed: number,
  ordered: number,
  start: number,
  end: number,
  column: number,
  table: number,
  gradScratch: number,
  rowScratch: number,
) => number;

type GradientPass = (
  score: number,
  label: number,
  validation: number,
  out: number,
  position: number,
  start: number,
  end: number,
  results: number,
  step: number,
  pow2: number,
) => number;

type HistogramPass = (
  bins: number,
  stride: number,
  count: number,
  pairs: number,
  hist: number,
) => void;

let compiled: WebAssembly.Module | null | undefined;

/**
 * The compiled tree kernel, or null where this engine cannot run it (no
 * WebAssembly SIMD or threads): callers then keep to the JavaScript kernels.
 * Compiled once per thread.
 *
 * @example
 * if (treeKernelModule() !== null) new TreeKernel(memory, 32_768, 8);
 */
export function treeKernelModule(): WebAssembly.Module | null {
  if (compiled === undefined) {
    const bytes = Buffer.from(TREE_KERNEL_BASE64, "base64");
    compiled = WebAssembly.validate(bytes) ? new WebAssembly.Module(bytes) : null;
  }
  return compiled;
}

/** Bytes of a thread's tables (EXP_NEG_STEP, EXP_NEG_POW2) and running sums in the memory. */
const TABLE_BYTES = 8 * (EXP_NEG_STEP.length + EXP_NEG_POW2.length);
const RESULT_BYTES = 48;

/**
 * The WebAssembly tree kernel (tree-kernel-wat.ts) over one shared memory, on the
 * thread that made it (every thread instantiates its own; the memory is shared).
 * Its sums are those of accumulateHistogram, its partitions those of
 * partitionRows and its gradients those of logLossGradients without weights, bit
 * for bit. The thread takes memory of its own (exp tables, running sums and, for
 * partitions, scratch for `scratchRows` rows of `stride` bytes) by growing the
 * memory: shared memory grows atomically, so threads get disjoint pages, and the
 * arrays already over it stay valid. `partition` is null when rows are wider
 * than the kernel's widest, and `partition` and `gradients` are null when the
 * memory has no room left; callers then use the JavaScript kernels.
 *
 * @example
 * const kernel = new TreeKernel(buffers.memory, buffers.blockRows, buffers.placedStride);
 * kernel.histogram(placed.byteOffset, 8, 8, 0, 1000, ordered.byteOffset, hist.byteOffset);
 */
export class TreeKernel {
  private readonly passes: HistogramPass[] = [];
  /** The partition of rows of this stride, with this thread's scratch; null without. */
  readonly partition:
    | ((
        placed: number,
        ordered: number,
        start: number,
        end: number,
        column: number,
        table: number,
      ) => number)
    | null = null;
  /**
   * logLossGradients without weights, over byte addresses of score, label,
   * validation (0 for none) and out; the same arguments otherwise. Null without room.
   */
  readonly gradients:
    | ((
        score: number,
        label: number,
        validation: number,
        out: number,
        position: number,
        start: number,
        end: number,
        sums: Float64Array,
        sumsBase: number,
      ) => number)
    | null = null;

  /**
   * addTreeToScores over byte addresses in the memory (bins, nodeColumn, goesRight,
   * leafValue, score); the same arguments otherwise.
   */
  readonly traverse: (
    bins: number,
    columnCount: number,
    start: number,
    end: number,
    depth: number,
    nodeColumn: number,
    goesRight: number,
    leafValue: number,
    score: number,
  ) => void;

  /**
   * Memory a thread takes for `scratchRows` rows of `stride` bytes (for sizing the
   * memory's maximum).
   */
  static scratchBytes(scratchRows: number, stride: number): number {
    const partitions = partitionWords(stride) > 0 ? Math.max(1, scratchRows) * (16 + stride) : 0;
    return TABLE_BYTES + RESULT_BYTES + partitions;
  }

  constructor(memory: WebAssembly.Memory, scratchRows: number, stride: number) {
    const module = treeKernelModule();
    if (module === null) throw new Error("trees: this engine cannot run the WebAssembly kernel");
    const instance = new WebAssembly.Instance(module, { env: { memory } });
    for (let k = 1; k <= MAX_HISTOGRAM_COLUMNS; k++) {
      this.passes.push(instance.exports[`hist${k}`] as HistogramPass);
    }
    this.traverse = instance.exports.traverse as TreeKernel["traverse"];
    let own: number;
    try {
      own = memory.grow(Math.ceil(TreeKernel.scratchBytes(scratchRows, stride) / 65536)) * 65536;
    } catch {
      return; // no room left below the memory's maximum
    }
    const step = own;
    const pow2 = step + 8 * EXP_NEG_STEP.length;
    const results = pow2 + 8 * EXP_NEG_POW2.length;
    new Float64Array(memory.buffer, step, EXP_NEG_STEP.length).set(EXP_NEG_STEP);
    new Float64Array(memory.buffer, pow2, EXP_NEG_POW2.length).set(EXP_NEG_POW2);
    const sumsOut = new Float64Array(memory.buffer, results, 4);
    const countsOut = new Int32Array(memory.buffer, results + 32, 3);
    const scalar = instance.exports.gradients as GradientPass;
    const paired = instance.exports.gradients2 as GradientPass;
    this.gradients = (score, label, validation, out, position, start, end, sums, sumsBase) => {
      sumsOut[0] = 0;
      sumsOut[1] = 1;
      sumsOut[2] = 0;
      sumsOut[3] = 1;
      countsOut.fill(0);
      // Rows in pairs, then the odd last row alone; the running sums carry over.
      const middle = start + ((end - start) & ~1);
      let packed = position;
      if (middle > start) {
        packed = paired(score, label, validation, out, packed, start, middle, results, step, pow2);
      }
      if (end > middle) {
        packed = scalar(score, label, validation, out, packed, middle, end, results, step, pow2);
      }
      // The end of logLossGradients, on this side: Math.log has no WebAssembly twin.
      sums[sumsBase] += sumsOut[0] + (countsOut[0] * 512 * Math.LN2 - Math.log(sumsOut[1]));
      sums[sumsBase + 1] += end - start - countsOut[2];
      sums[sumsBase + 2] += sumsOut[2] + (countsOut[1] * 512 * Math.LN2 - Math.log(sumsOut[3]));
      sums[sumsBase + 3] += countsOut[2];
      return packed;
    };
    const words = partitionWords(stride);
    if (words === 0) return;
    const gradScratch = results + RESULT_BYTES;
    const rowScratch = gradScratch + 16 * Math.max(1, scratchRows);
    const pass = instance.exports[`part${words}`] as PartitionPass;
    this.partition = (placed, ordered, start, end, column, table) =>
      pass(placed, ordered, start, end, column, table, gradScratch, rowScratch);
  }

  /**
   * accumulateHistogram over byte addresses in the memory: positions start .. end - 1,
   * their bins at placed + i * stride, their pairs at ordered + 16 i, summed into
   * the histogram at `hist`. Columns go in passes of up to eight, as in the
   * JavaScript kernel (each pass's slice of the histogram stays in L1).
   */
  histogram(
    placed: number,
    stride: number,
    columnCount: number,
    start: number,
    end: number,
    ordered: number,
    hist: number,
  ): void {
    const count = end - start;
    if (count <= 0) return;
    const bins = placed + start * stride;
    const pairs = ordered + 16 * start;
    for (let c = 0; c < columnCount; c += MAX_HISTOGRAM_COLUMNS) {
      const k = Math.min(MAX_HISTOGRAM_COLUMNS, columnCount - c);
      this.passes[k - 1](bins + c, stride, count, pairs, hist + c * 4096);
    }
  }
}

/** 32-bit words per row for the partition kernel, or 0 when it has no function for `stride`. */
function partitionWords(stride: number): number {
  const words = stride / 4;
  return Number.isInteger(words) && words >= 1 && words <= MAX_PARTITION_WORDS ? words : 0;
}
