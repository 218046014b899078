import { checkScoringModel } from "./check-scoring-model.js";
import { ColumnBinder } from "./column-binder.js";
import type { ColumnarBatch } from "./columnar-batch.js";
import { compileForest, type CompiledForest } from "./compile-forest.js";
import { allocateRowBlock } from "./allocate-row-block.js";
import { chunkRows } from "./chunk-rows.js";
import { compileInputs, type InputPlan } from "./compile-inputs.js";
import { encodedLayout, type EncodedLayout } from "./encoded-layout.js";
import { fillItem, type ItemScratch } from "./fill-item.js";
import { forestKernel } from "./forest-kernel.js";
import type { EncodedBatch, ScoringModel } from "./model-types.js";
import type { ScoreItem } from "./score-item.js";
import { VirtualSlots } from "./virtual-slots.js";
import { ScorerError } from "./scorer-error.js";
import { clipStandardized } from "./clip-standardized.js";

/** Output space for encode: offsets of at least rowCount + 1 entries, index and value of at least rowCount * maxEntriesPerRow. */
export interface EncodedBuffers {
  readonly offsets: Uint32Array;
  readonly index: Int32Array;
  /** null when the encoding has no standardized numerics (every entry is 1). */
  readonly value: Float64Array | null;
}

/**
 * Encodes rows into the heads' sparse input (EncodedBatch, CSR), exactly as the
 * scorer reads them: per row, the encoded index of the leaf every tree reaches
 * (forest by forest, tree by tree), then the hashed buckets of the present
 * categorical values and crosses (sorted; two features landing in one bucket
 * give two equal entries, so the dot product counts it twice), then the
 * standardized numerics that are present and finite, with their values. Rows
 * are therefore ascending in index. Entries are 1 except the standardized
 * numerics; `value` is null when there are none.
 *
 * Given output buffers (see allocate), encoding allocates nothing per row.
 * For the FTRL heads: train on encode(batch) and the scorer computes the same
 * features at serving time.
 *
 * @example
 * const encoder = new RowEncoder({ contract, forests, encoding });
 * const buffers = encoder.allocate(65536);
 * const encoded = encoder.encode(batch, buffers); // batch.rowCount <= 65536
 * // row r: encoded.index[encoded.offsets[r] .. encoded.offsets[r + 1])
 */
export class RowEncoder {
  readonly layout: EncodedLayout;
  /** The most entries a row can have: trees + hashed features + standardized numerics. */
  readonly maxEntriesPerRow: number;
  private readonly plan: InputPlan;
  private readonly forests: readonly CompiledForest[];
  private readonly binder: ColumnBinder;
  private readonly hasValues: boolean;
  private readonly chunk: number;
  private readonly block: Float64Array;
  private readonly codes: Int32Array;
  private readonly slots: Int32Array;
  private readonly hashedSlots: Int32Array;
  private readonly scratch: ItemScratch;

  /** Checks the model (throws a ScorerError naming every problem) and compiles its forests. */
  constructor(model: Pick<ScoringModel, "contract" | "forests" | "encoding">) {
    const issues = checkScoringModel({ ...model, heads: [], valueWeights: [] });
    if (issues.length > 0) throw new ScorerError("model", issues);
    this.layout = encodedLayout(model.forests, model.encoding);
    const virtual = VirtualSlots.plan(model.forests, model.contract);
    this.forests = model.forests.map((forest) => compileForest(forest, model.contract, virtual));
    this.plan = compileInputs(model.contract, model.encoding, this.layout, virtual);
    this.binder = new ColumnBinder(this.plan);
    this.hasValues = model.encoding.numeric.length > 0;
    this.maxEntriesPerRow =
      this.layout.treeCount + this.plan.hashedSlotCount + model.encoding.numeric.length;
    this.chunk = chunkRows(this.plan.stride);
    this.block = allocateRowBlock(this.plan, this.chunk);
    this.codes = new Int32Array(this.chunk * this.plan.stride);
    this.slots = new Int32Array(this.chunk * Math.max(1, this.layout.treeCount));
    this.hashedSlots = new Int32Array(this.chunk * Math.max(1, this.plan.hashedSlotCount));
    this.scratch = {
      texts: this.plan.categoricalNames.map(() => null),
      parts: new Array<string>(8).fill(""),
    };
  }

  /** Output buffers large enough for `rowCount` rows. */
  allocate(rowCount: number): EncodedBuffers {
    const entries = rowCount * this.maxEntriesPerRow;
    return {
      offsets: new Uint32Array(rowCount + 1),
      index: new Int32Array(entries),
      value: this.hasValues ? new Float64Array(entries) : null,
    };
  }

  /** Encodes a columnar batch (see ColumnarBatch); into `out` when given. */
  encode(batch: ColumnarBatch, out?: EncodedBuffers): EncodedBatch {
    const bound = this.binder.bind(batch);
    const buffers = this.buffersFor(bound.rowCount, out);
    let position = 0;
    for (let start = 0; start < bound.rowCount; start += this.chunk) {
      const count = Math.min(this.chunk, bound.rowCount - start);
      this.binder.fill(
        bound,
        start,
        count,
        this.block,
        this.codes,
        this.hashedSlots,
        this.scratch.parts,
      );
      position = this.writeChunk(count, start, position, buffers);
    }
    buffers.offsets[bound.rowCount] = position;
    return {
      rowCount: bound.rowCount,
      offsets: buffers.offsets,
      index: buffers.index,
      value: buffers.value,
    };
  }

  /** Encodes a list of items (read as Scorer.scoreOne reads them); into `out` when given. */
  encodeItems(items: readonly ScoreItem[], out?: EncodedBuffers): EncodedBatch {
    const buffers = this.buffersFor(items.length, out);
    let position = 0;
    for (let start = 0; start < items.length; start += this.chunk) {
      const count = Math.min(this.chunk, items.length - start);
      for (let i = 0; i < count; i++)
        fillItem(
          this.plan,
          items[start + i],
          this.block,
          this.codes,
          this.hashedSlots,
          i,
          this.scratch,
        );
      position = this.writeChunk(count, start, position, buffers);
    }
    buffers.offsets[items.length] = position;
    return {
      rowCount: items.length,
      offsets: buffers.offsets,
      index: buffers.index,
      value: buffers.value,
    };
  }

  private buffersFor(rowCount: number, out: EncodedBuffers | undefined): EncodedBuffers {
    if (out === undefined) return this.allocate(rowCount);
    const entries = rowCount * this.maxEntriesPerRow;
    if (
      out.offsets.length < rowCount + 1 ||
      out.index.length < entries ||
      (this.hasValues && (out.value === null || out.value.length < entries))
    ) {
      throw new ScorerError("encode", [
        {
          code: "buffer_size",
          path: "",
          message: `expected buffers for ${rowCount} rows (offsets ${rowCount + 1}, entries ${entries}${this.hasValues ? " with values" : ""}), found offsets ${out.offsets.length}, entries ${out.index.length}`,
        },
      ]);
    }
    return out;
  }

  /** Traverses and writes rows [start, start + count) from the filled chunk; returns the next free position. */
  private writeChunk(count: number, start: number, position: number, out: EncodedBuffers): number {
    const { plan, layout, slots, hashedSlots, block } = this;
    const treeCount = layout.treeCount;
    let treeOffset = 0;
    for (let f = 0; f < this.forests.length; f++) {
      const forest = this.forests[f];
      forestKernel(
        forest,
        block,
        this.codes,
        plan.stride,
        count,
        slots,
        treeCount,
        treeOffset,
        layout.leafOffset[f],
        forest.leaves,
      );
      treeOffset += forest.treeCount;
    }
    const { offsets, index, value } = out;
    const K = plan.hashedSlotCount;
    const standardized = plan.standardizedFeature;
    let p = position;
    for (let i = 0; i < count; i++) {
      offsets[start + i] = p;
      for (let t = 0; t < treeCount; t++) index[p + t] = slots[i * treeCount + t];
      if (value !== null) value.fill(1, p, p + treeCount);
      p += treeCount;
      // Present hashed buckets, insertion-sorted (a handful per row).
      const first = p;
      for (let k = 0; k < K; k++) {
        const slot = hashedSlots[i * K + k];
        if (slot < 0) continue;
        let at = p;
        while (at > first && index[at - 1] > slot) {
          index[at] = index[at - 1];
          at--;
        }
        index[at] = slot;
        if (value !== null) value[p] = 1;
        p++;
      }
      for (let j = 0; j < standardized.length; j++) {
        const x = block[i * plan.stride + standardized[j]];
        if (!Number.isFinite(x) || value === null) continue;
        index[p] = plan.numericOffset + j;
        value[p] = clipStandardized(x, plan.mean[j], plan.std[j]);
        p++;
      }
    }
    return p;
  }
}
