import { addHashedWeights } from "./add-hashed-weights.js";
import { addNumericWeights } from "./add-numeric-weights.js";
import { checkScoringModel } from "./check-scoring-model.js";
import { ColumnBinder } from "./column-binder.js";
import type { ColumnarBatch } from "./columnar-batch.js";
import { compileForest, type CompiledForest } from "./compile-forest.js";
import { compileHeads, type CompiledHeads } from "./compile-heads.js";
import { allocateRowBlock } from "./allocate-row-block.js";
import { chunkRows } from "./chunk-rows.js";
import { compileInputs, type InputPlan } from "./compile-inputs.js";
import { encodedLayout, type EncodedLayout } from "./encoded-layout.js";
import { fillItem, type ItemScratch } from "./fill-item.js";
import { finishScores } from "./finish-scores.js";
import { forestKernel } from "./forest-kernel.js";
import type { ScoringModel } from "./model-types.js";
import type { ScoreItem } from "./score-item.js";
import { VirtualSlots } from "./virtual-slots.js";
import { ScorerError } from "./scorer-error.js";
import { sumLeafWeights } from "./sum-leaf-weights.js";
import { treeGroup } from "./tree-group.js";

/** The scores of one item. */
export interface ScoreResult {
  /**
   * Outcome to served probability q (after any downsampling correction). Read it
   * by outcome name; it has no prototype when an outcome is named "__proto__".
   */
  readonly probability: Readonly<Record<string, number>>;
  /** sum over heads of valueWeight * q. */
  readonly combined: number;
}

/** The scores of a batch, one entry per row. */
export interface BatchScores {
  readonly probability: Readonly<Record<string, Float64Array>>;
  readonly combined: Float64Array;
}

/**
 * A loaded model, ready to score: single items, columnar batches or lists of
 * items, and ranking by the combined score. Builds every table once; scoring
 * allocates only its outputs. Not reentrant (one call at a time, as JavaScript
 * runs anyway); an item getter that calls back into the scorer is refused.
 *
 * @example
 * const scorer = createScorer(model); // or loadScorer(artifactText)
 * scorer.scoreOne({ tie_strength: 0.4, crop: "kale" }); // { probability: { open: 0.31, ... }, combined: 0.52 }
 * scorer.rank(candidates); // Uint32Array of candidate indexes, best first
 */
export class Scorer {
  /** The model it was built from. */
  readonly model: ScoringModel;
  readonly layout: EncodedLayout;
  /** Outcomes of the heads, in head order. */
  readonly outcomes: readonly string[];
  private readonly plan: InputPlan;
  private readonly forests: readonly CompiledForest[];
  private readonly heads: CompiledHeads;
  private readonly binder: ColumnBinder;
  private readonly treeCount: number;
  private readonly chunk: number;
  private readonly treeGroup: number;
  private readonly block: Float64Array;
  private readonly codes: Int32Array;
  private readonly slots: Int32Array;
  private readonly hashedSlots: Int32Array;
  private readonly z: Float64Array;
  private readonly scratch: ItemScratch;
  private readonly oneProbability: Float64Array[];
  private readonly oneCombined = new Float64Array(1);
  private readonly plainRecords: boolean;
  private busy = false;

  /**
   * Checks the model (throws a ScorerError listing every problem, labelled with
   * `source`) and builds the scoring tables.
   */
  constructor(model: ScoringModel, source = "model") {
    const issues = checkScoringModel(model);
    if (issues.length > 0) throw new ScorerError(source, issues);
    this.model = model;
    this.layout = encodedLayout(model.forests, model.encoding);
    const virtual = VirtualSlots.plan(model.forests, model.contract);
    this.forests = model.forests.map((forest) => compileForest(forest, model.contract, virtual));
    this.plan = compileInputs(model.contract, model.encoding, this.layout, virtual);
    this.heads = compileHeads(model.heads, model.valueWeights, this.layout);
    this.outcomes = this.heads.outcomes;
    this.plainRecords = !this.outcomes.includes("__proto__");
    this.binder = new ColumnBinder(this.plan);
    this.treeCount = this.layout.treeCount;
    this.chunk = chunkRows(this.plan.stride);
    const leavesPerTree = Math.max(1, ...this.forests.map((forest) => forest.leaves));
    this.treeGroup = treeGroup(leavesPerTree, this.heads.lanes);
    this.block = allocateRowBlock(this.plan, this.chunk);
    this.codes = new Int32Array(this.chunk * this.plan.stride);
    this.slots = new Int32Array(this.chunk * Math.max(1, this.treeCount));
    this.hashedSlots = new Int32Array(this.chunk * Math.max(1, this.plan.hashedSlotCount));
    this.z = new Float64Array(this.chunk * this.heads.lanes);
    this.scratch = {
      texts: this.plan.categoricalNames.map(() => null),
      parts: new Array<string>(8).fill(""),
    };
    this.oneProbability = this.outcomes.map(() => new Float64Array(1));
  }

  /** The features an item or batch provides, by kind. */
  get features(): { readonly numeric: readonly string[]; readonly categorical: readonly string[] } {
    return { numeric: this.plan.numericNames, categorical: this.plan.categoricalNames };
  }

  /** Scores one item. */
  scoreOne(item: ScoreItem): ScoreResult {
    const combined = this.scoreOneInto(item, null);
    // A plain object is several times cheaper to fill than a prototype-less one; an
    // outcome named "__proto__" would set the prototype of a plain object, so then not.
    const probability: Record<string, number> = this.plainRecords
      ? {}
      : (Object.create(null) as Record<string, number>);
    for (let h = 0; h < this.outcomes.length; h++) {
      probability[this.outcomes[h]] = this.oneProbability[h][0];
    }
    return { probability, combined };
  }

  /**
   * Scores one item without allocating: writes each head's probability to
   * `probability[h]` (in `outcomes` order) when given, returns the combined score.
   */
  scoreOneInto(item: ScoreItem, probability: Float64Array | null): number {
    this.enter();
    try {
      this.fillOne(item, true);
      this.scoreChunk(1, this.oneProbability, this.oneCombined, 0);
    } finally {
      this.busy = false;
    }
    if (probability !== null) {
      for (let h = 0; h < this.outcomes.length; h++) probability[h] = this.oneProbability[h][0];
    }
    return this.oneCombined[0];
  }

  /**
   * Scores a columnar batch (see ColumnarBatch); into `out` when given (see
   * allocateScores: reusing outputs spares a serving loop fresh memory per call;
   * entries past the batch's rows are left as they were).
   */
  scoreBatch(batch: ColumnarBatch, out?: BatchScores): BatchScores {
    const bound = this.binder.bind(batch);
    const scores = this.outputFor(bound.rowCount, out);
    this.enter();
    try {
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
        this.scoreChunk(count, scores.arrays, scores.combined, start);
      }
    } finally {
      this.busy = false;
    }
    return scores.result;
  }

  /** Scores a list of items, as scoreOne each, at batch speed; into `out` when given. */
  scoreItems(items: readonly ScoreItem[], out?: BatchScores): BatchScores {
    const scores = this.outputFor(items.length, out);
    this.enter();
    try {
      for (let start = 0; start < items.length; start += this.chunk) {
        const count = Math.min(this.chunk, items.length - start);
        for (let i = 0; i < count; i++) this.fillRow(items[start + i], i, true);
        this.scoreChunk(count, scores.arrays, scores.combined, start);
      }
    } finally {
      this.busy = false;
    }
    return scores.result;
  }

  /** Candidate indexes ordered by combined score, best first (ties: lower index first). */
  rank(candidates: readonly ScoreItem[] | ColumnarBatch): Uint32Array {
    const { combined } = Array.isArray(candidates)
      ? this.scoreItems(candidates as readonly ScoreItem[])
      : this.scoreBatch(candidates as ColumnarBatch);
    const order = new Uint32Array(combined.length);
    for (let i = 0; i < order.length; i++) order[i] = i;
    return order.sort((a, b) => combined[b] - combined[a] || a - b);
  }

  /**
   * The encoded index of the leaf each tree reaches for one item (forest by
   * forest, tree by tree), without scoring the heads.
   */
  traverseOne(item: ScoreItem, out: Int32Array = new Int32Array(this.treeCount)): Int32Array {
    this.enter();
    try {
      this.fillOne(item, false);
      this.traverseChunk(1);
    } finally {
      this.busy = false;
    }
    out.set(this.slots.subarray(0, this.treeCount));
    return out;
  }

  /** As traverseOne for every row of a batch: row i's leaves at [i * trees, (i + 1) * trees). */
  traverseBatch(batch: ColumnarBatch, out?: Int32Array): Int32Array {
    const bound = this.binder.bind(batch);
    const leaves = out ?? new Int32Array(bound.rowCount * this.treeCount);
    this.enter();
    try {
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
          false,
        );
        this.traverseChunk(count);
        leaves.set(this.slots.subarray(0, count * this.treeCount), start * this.treeCount);
      }
    } finally {
      this.busy = false;
    }
    return leaves;
  }

  private enter(): void {
    if (this.busy) {
      throw new ScorerError("scorer", [
        {
          code: "reentrant",
          path: "",
          message:
            "expected one call at a time, found a call from inside a scoring call (an item getter?)",
        },
      ]);
    }
    this.busy = true;
  }

  private fillOne(item: ScoreItem, withHashing: boolean): void {
    this.fillRow(item, 0, withHashing);
  }

  private fillRow(item: ScoreItem, row: number, withHashing: boolean): void {
    fillItem(
      this.plan,
      item,
      this.block,
      this.codes,
      this.hashedSlots,
      row,
      this.scratch,
      withHashing,
    );
  }

  private traverseChunk(count: number): void {
    const stride = this.plan.stride;
    let treeOffset = 0;
    for (let f = 0; f < this.forests.length; f++) {
      const forest = this.forests[f];
      forestKernel(
        forest,
        this.block,
        this.codes,
        stride,
        count,
        this.slots,
        this.treeCount,
        treeOffset,
        this.layout.leafOffset[f],
        forest.leaves,
      );
      treeOffset += forest.treeCount;
    }
  }

  private scoreChunk(
    count: number,
    probability: readonly Float64Array[],
    combined: Float64Array,
    start: number,
  ): void {
    this.traverseChunk(count);
    const heads = this.heads;
    sumLeafWeights(
      this.slots,
      this.treeCount,
      count,
      heads.leafWeight,
      heads.lanes,
      this.treeGroup,
      this.z,
    );
    if (this.plan.hashedSlotCount > 0) {
      addHashedWeights(
        this.hashedSlots,
        this.plan.hashedSlotCount,
        count,
        this.layout.hashedOffset,
        heads,
        this.z,
      );
    }
    if (this.plan.standardizedFeature.length > 0)
      addNumericWeights(this.plan, this.block, count, heads, this.z);
    finishScores(heads, this.z, count, probability, combined, start);
  }

  /** Output arrays for `rowCount` rows, for scoreBatch and scoreItems to fill again and again. */
  allocateScores(rowCount: number): BatchScores {
    const probability: Record<string, Float64Array> = Object.create(null) as Record<
      string,
      Float64Array
    >;
    for (const outcome of this.outcomes) probability[outcome] = new Float64Array(rowCount);
    return { probability, combined: new Float64Array(rowCount) };
  }

  private outputFor(
    rowCount: number,
    out: BatchScores | undefined,
  ): { arrays: Float64Array[]; combined: Float64Array; result: BatchScores } {
    const result = out ?? this.allocateScores(rowCount);
    const arrays = this.outcomes.map((outcome) => {
      const array = Object.prototype.hasOwnProperty.call(result.probability, outcome)
        ? result.probability[outcome]
        : undefined;
      if (!(array instanceof Float64Array) || array.length < rowCount) {
        throw new ScorerError("scorer", [
          {
            code: "output_size",
            path: `/probability/${outcome}`,
            message: `expected a Float64Array of at least ${rowCount} entries, found ${array instanceof Float64Array ? array.length : typeof array}`,
          },
        ]);
      }
      return array;
    });
    if (!(result.combined instanceof Float64Array) || result.combined.length < rowCount) {
      throw new ScorerError("scorer", [
        {
          code: "output_size",
          path: "/combined",
          message: `expected a Float64Array of at least ${rowCount} entries`,
        },
      ]);
    }
    return { arrays, combined: result.combined, result };
  }
}
