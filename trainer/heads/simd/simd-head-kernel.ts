import { LeafcastError } from "../../errors.js";
import type { FtrlRule, KernelBatch } from "../head-block.js";
import { HeadRowOutcomes } from "../head-row-outcomes.js";
import { FTRL_KERNEL_BASE64 } from "./ftrl-kernel.generated.js";
import type { SimdHeadBlock } from "./simd-head-block.js";

const PAGE = 65536;
/** Index entries copied into the kernel's memory at a time (rows are never split). */
const CHUNK_ENTRIES = 1 << 16;

type ScoreRow = (start: number, end: number, bias: number, nextEnd: number) => void;
type UpdateRow = (start: number, end: number, bias: number) => void;

let compiled: WebAssembly.Module | null = null;

/**
 * Trains one SimdHeadBlock with the WebAssembly FTRL kernel, on the thread that
 * made it (each thread instantiates its own; the block's memory is shared). The
 * results are bit for bit those of trainHeadBlock on the same heads.
 *
 * @example
 * const kernel = new SimdHeadKernel(block, rule);
 * kernel.train(batch); // advances the block's z, n and sums
 */
export class SimdHeadKernel {
  private block: SimdHeadBlock;
  private readonly rule: FtrlRule;
  private readonly outcomes: HeadRowOutcomes;
  private readonly score: ScoreRow;
  private readonly update: UpdateRow;
  private readonly configure: (...args: number[]) => void;
  private rowCapacity = 0;
  private hasValues = -1;
  private index = new Int32Array(0);
  private value = new Float64Array(0);
  private logit = new Float64Array(0);
  private grad = new Float64Array(0);

  constructor(block: SimdHeadBlock, rule: FtrlRule) {
    this.block = block;
    this.rule = rule;
    this.outcomes = new HeadRowOutcomes(block.heads, rule);
    compiled ??= new WebAssembly.Module(Buffer.from(FTRL_KERNEL_BASE64, "base64"));
    const instance = new WebAssembly.Instance(compiled, { env: { memory: block.memory } });
    const exports = instance.exports as Record<string, (...args: number[]) => void>;
    this.score = exports[`score${block.lanes / 2}`] as ScoreRow;
    this.update = exports[`update${block.lanes / 2}`] as UpdateRow;
    this.configure = exports.configure;
  }

  /** Moves the block's per-slice sums to a larger array (slices outgrew the old one). */
  useSliceStats(sliceStats: Float64Array): void {
    this.block = { ...this.block, sliceStats };
  }

  train(batch: KernelBatch): void {
    const { rowCount, offsets, index, value } = batch;
    this.prepare(batch.maxRowLength, value !== null);
    const { block, score, update, outcomes, logit, grad } = this;
    const bias = this.rule.biasCoordinate;
    const capacity = this.index.length;
    outcomes.begin(batch, {
      overall: block.overall,
      sliceStats: block.sliceStats,
      stride: block.heads.length,
      offset: 0,
    });
    for (let first = 0; first < rowCount;) {
      // The longest run of whole rows whose entries fit the index region.
      const base = offsets[first];
      let last = first + 1;
      while (last < rowCount && offsets[last + 1] - base <= capacity) last++;
      const entries = offsets[last] - base;
      this.index.set(index.subarray(base, base + entries));
      if (value !== null) this.value.set(value.subarray(base, base + entries));
      for (let r = first; r < last; r++) {
        const start = offsets[r] - base;
        const end = offsets[r + 1] - base;
        score(start, end, bias, r + 1 < last ? offsets[r + 2] - base : end);
        if (outcomes.row(r, logit, grad)) update(start, end, bias);
      }
      first = last;
    }
  }

  /** Lays out the scratch space after the state for rows of up to `maxRowLength` entries, growing the memory once if needed. */
  private prepare(maxRowLength: number, hasValues: boolean): void {
    const rows = Math.max(1, maxRowLength);
    if (rows <= this.rowCapacity && (hasValues ? 1 : 0) === this.hasValues) return;
    const { memory, lanes, pagesAt, scratchAt } = this.block;
    const rowBytes = rows * lanes * 8;
    const entries = Math.max(CHUNK_ENTRIES, rows);
    const grad = scratchAt;
    const logit = grad + align(lanes * 8);
    const biasW = logit + align(lanes * 8);
    const biasS = biasW + align(lanes * 8);
    const weights = biasS + align(lanes * 8);
    const roots = weights + align(rowBytes);
    const indexAt = roots + align(rowBytes);
    const valueAt = indexAt + align(entries * 4);
    const end = valueAt + (hasValues ? entries * 8 : 0);
    const have = memory.buffer.byteLength;
    if (end > have) {
      try {
        memory.grow(Math.ceil((end - have) / PAGE));
      } catch {
        throw new LeafcastError("heads", [
          {
            code: "kernel_memory",
            message: `rows of ${maxRowLength} entries need more kernel memory than WebAssembly's 4 GiB allows beside the heads' state`,
          },
        ]);
      }
    }
    const buffer = memory.buffer;
    this.grad = new Float64Array(buffer, grad, lanes);
    this.logit = new Float64Array(buffer, logit, lanes);
    this.index = new Int32Array(buffer, indexAt, entries);
    this.value = new Float64Array(buffer, valueAt, hasValues ? entries : 0);
    this.grad.fill(0);
    const { alpha, beta, lambda1, lambda2 } = this.rule;
    this.configure(
      0,
      lanes,
      indexAt,
      valueAt,
      hasValues ? 1 : 0,
      weights,
      roots,
      logit,
      grad,
      biasW,
      biasS,
      pagesAt,
      1 / alpha,
      beta,
      lambda1,
      lambda2,
    );
    this.rowCapacity = rows;
    this.hasValues = hasValues ? 1 : 0;
  }
}

function align(bytes: number): number {
  return Math.ceil(bytes / 64) * 64;
}
