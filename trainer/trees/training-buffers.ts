import { COLUMN_SLOTS, SLOT_VALUES } from "./histogram-kernel.js";
import { TreeKernel, treeKernelModule } from "./simd/tree-kernel.js";

/**
 * The memory that the tree learner and its worker threads share. Every array is a
 * view over a SharedArrayBuffer, so posting this object to a worker shares the
 * memory instead of copying it.
 */
export interface TrainingBuffers {
  /**
   * The shared WebAssembly memory that holds `placed`, `ordered`, `blockHist`,
   * `goesRight`, `nodeColumn`, `leafValue`, `score`, `gradHess`, `label`,
   * `validation` and a copy of `bins` (and grows by each thread's own part),
   * for the WebAssembly tree kernel (simd/tree-kernel.ts), which each thread
   * instantiates over it; null where the engine cannot run the kernel or the
   * arrays would pass MAX_KERNEL_BYTES (the JavaScript kernels then run instead).
   */
  readonly memory: WebAssembly.Memory | null;
  /**
   * Row-major bins (BinnedFeatures.bins, or its copy in `memory`), in row order; read
   * to score rows outside a tree.
   */
  readonly bins: Uint8Array;
  readonly columnCount: number;
  /**
   * The bins again, by position: position i's row at i * placedStride, moved
   * along by every partition, so a node's rows are contiguous bytes and histograms
   * and partitions read them sequentially (a deep node's rows scattered over the
   * row-major matrix cost 7 to 8 times more per row in a probe here). One copy for
   * the whole run, refilled per tree (TreeTaskOp.place).
   */
  readonly placed: Uint8Array;
  /** Bytes per row in `placed`: columnCount rounded up to whole 32-bit words. */
  readonly placedStride: number;
  /** `placed` as 32-bit words (placedStride / 4 per row), for moving rows whole. */
  readonly placedWords: Uint32Array;
  /** Numbers in one histogram: SLOT_VALUES (gradient, hessian) per slot, 256 slots per column. */
  readonly histSize: number;
  /** Most rows in one segment (the root's segments are this long; children's are shorter). */
  readonly blockRows: number;
  /** Raw scores (log-odds) of every row. */
  readonly score: Float64Array;
  /**
   * Per row r: gradient at 2r, hessian at 2r + 1; only for trees on a row sample
   * (empty otherwise: the gradient round then writes `ordered` and `placed` directly).
   */
  readonly gradHess: Float64Array;
  /** The same pairs by position (position i at 2i, as in `placed`), moved along by every partition. */
  readonly ordered: Float64Array;
  /** Labels of the outcome being fitted (rewritten per forest). */
  readonly label: Uint8Array;
  readonly weight: Float64Array | null;
  /** 1 for validation rows, null without a validation set. */
  readonly validation: Uint8Array | null;
  /**
   * A row sample's rows, ascending, for placing their bins and gradient pairs
   * (TreeTaskOp.place); empty when trees use every training row.
   */
  readonly rows: Uint32Array;
  /** Per internal node of the current tree: 256 bytes, 1 where that bin goes right. */
  readonly goesRight: Uint8Array;
  /** Per internal node of the current tree: its split column (0 for pass-through nodes). */
  readonly nodeColumn: Int32Array;
  /**
   * Per leaf position of the current tree at its depth: the leaf value (a leaf
   * above that depth at the leftmost position below it); see addTreeToScores.
   */
  readonly leafValue: Float64Array;
  /** Block histograms of one round, histSize numbers each. */
  readonly blockHist: Float64Array;
  /**
   * [k]: k > 0 when the last gradient round also summed the next tree's root
   * histogram, as blockHist's first k blocks (see gradientRound); 0 otherwise.
   */
  readonly rootHistBlocks: Int32Array;
  /** Left-row counts of a partition round, one per segment. */
  readonly counts: Int32Array;
  /** Loss sums of a gradient round, 4 per row block. */
  readonly sums: Float64Array;
}

export interface TrainingBufferSizes {
  readonly rowCount: number;
  readonly columnCount: number;
  readonly blockRows: number;
  readonly hasWeight: boolean;
  readonly hasValidation: boolean;
  /** Whether trees sample rows (rowFraction < 1), which needs gradients by row. */
  readonly sampleRows: boolean;
  readonly maxDepth: number;
  readonly histogramBlocks: number;
  readonly segments: number;
  readonly lossBlocks: number;
  /**
   * Whether to lay the arrays out in one WebAssembly memory for the WebAssembly
   * kernels (default true); false keeps plain SharedArrayBuffers and the
   * JavaScript kernels.
   */
  readonly webAssembly?: boolean;
}

/**
 * Allocates the shared buffers for one fitting run over `bins`.
 *
 * @example
 * const buffers = createTrainingBuffers(binned.bins, sizes);
 * buffers.histSize; // 512 per binned column
 */
export function createTrainingBuffers(
  bins: Uint8Array,
  sizes: TrainingBufferSizes,
): TrainingBuffers {
  const n = sizes.rowCount;
  const histSize = SLOT_VALUES * COLUMN_SLOTS * sizes.columnCount;
  const internal = 2 ** sizes.maxDepth - 1;
  const placedStride = 4 * Math.ceil(sizes.columnCount / 4);
  const rowsLength = sizes.sampleRows ? n : 0;
  const placedBytes = n * placedStride;
  const blockHistLength = sizes.histogramBlocks * histSize;
  // One memory, regions at 16-byte boundaries, and room to grow by every thread's
  // own part (see TreeKernel).
  let end = 0;
  const region = (bytes: number): number => {
    const at = end;
    end = 16 * Math.ceil((at + Math.max(1, bytes)) / 16);
    return at;
  };
  region(Math.max(4, placedBytes));
  const orderedAt = region(16 * n);
  const blockHistAt = region(8 * blockHistLength);
  const goesRightAt = region(256 * internal);
  const scoreAt = region(8 * n);
  const gradHessAt = region(sizes.sampleRows ? 16 * n : 0);
  const labelAt = region(n);
  const validationAt = region(sizes.hasValidation ? n : 0);
  const nodeColumnAt = region(4 * internal);
  const leafValueAt = region(8 * (internal + 1));
  const binsAt = region(bins.length);
  const initial = Math.ceil(end / PAGE);
  const threadPages = Math.ceil(TreeKernel.scratchBytes(sizes.blockRows, placedStride) / PAGE);
  const maximum = Math.min(MAX_KERNEL_BYTES / PAGE, initial + MAX_THREADS * threadPages);
  const memory =
    sizes.webAssembly !== false && initial + threadPages <= maximum && treeKernelModule() !== null
      ? new WebAssembly.Memory({ initial, maximum, shared: true })
      : null;
  const f64 = (at: number, length: number): Float64Array =>
    memory === null ? sharedFloat64(length) : new Float64Array(memory.buffer, at, length);
  const u8 = (at: number, length: number): Uint8Array =>
    memory === null ? sharedBytes(length) : new Uint8Array(memory.buffer, at, length);
  // The kernel's traversal reads the bins from its memory: one copy per fit.
  const kernelBins = memory === null ? bins : new Uint8Array(memory.buffer, binsAt, bins.length);
  if (kernelBins !== bins) kernelBins.set(bins);
  const placedBuffer = memory?.buffer ?? new SharedArrayBuffer(Math.max(4, placedBytes));
  return {
    memory,
    bins: kernelBins,
    columnCount: sizes.columnCount,
    placed: new Uint8Array(placedBuffer, 0, n * placedStride),
    placedStride,
    placedWords: new Uint32Array(placedBuffer, 0, (n * placedStride) / 4),
    histSize,
    blockRows: sizes.blockRows,
    score: f64(scoreAt, n),
    gradHess: f64(gradHessAt, sizes.sampleRows ? 2 * n : 0),
    ordered: f64(orderedAt, 2 * n),
    label: u8(labelAt, n),
    weight: sizes.hasWeight ? sharedFloat64(n) : null,
    validation: sizes.hasValidation ? u8(validationAt, n) : null,
    rows: new Uint32Array(new SharedArrayBuffer(4 * Math.max(1, rowsLength)), 0, rowsLength),
    goesRight: u8(goesRightAt, 256 * internal),
    nodeColumn:
      memory === null
        ? new Int32Array(new SharedArrayBuffer(4 * internal))
        : new Int32Array(memory.buffer, nodeColumnAt, internal),
    leafValue: f64(leafValueAt, internal + 1),
    blockHist: f64(blockHistAt, blockHistLength),
    rootHistBlocks: new Int32Array(new SharedArrayBuffer(4)),
    counts: new Int32Array(new SharedArrayBuffer(4 * Math.max(1, sizes.segments))),
    sums: sharedFloat64(4 * sizes.lossBlocks),
  };
}

/**
 * Most bytes of the kernel's memory: 2 GiB, so that every byte address is a
 * non-negative 32-bit integer on both sides of the JavaScript-WebAssembly call.
 */
const MAX_KERNEL_BYTES = 2 ** 31;

/** Threads whose partition scratch the memory has room for (more fall back to JavaScript). */
const MAX_THREADS = 64;

/** Bytes in a WebAssembly page. */
const PAGE = 65536;

function sharedFloat64(length: number): Float64Array {
  return new Float64Array(new SharedArrayBuffer(8 * Math.max(1, length)), 0, length);
}

function sharedBytes(length: number): Uint8Array {
  return new Uint8Array(new SharedArrayBuffer(Math.max(1, length)), 0, length);
}
