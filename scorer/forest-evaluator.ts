import { checkForestModel } from "./check-forest-model.js";
import { compileForest, type CompiledForest } from "./compile-forest.js";
import { allocateRowBlock } from "./allocate-row-block.js";
import { chunkRows } from "./chunk-rows.js";
import { compileInputs, type InputPlan } from "./compile-inputs.js";
import { encodedLayout } from "./encoded-layout.js";
import { fillForestInput } from "./fill-forest-input.js";
import { forestKernel } from "./forest-kernel.js";
import type { ForestColumns, ForestRows } from "./forest-input.js";
import type { FeatureContract, ForestModel } from "./model-types.js";
import { ScorerError } from "./scorer-error.js";
import { VirtualSlots } from "./virtual-slots.js";

/**
 * One forest compiled for the traversal kernels, for the trainer: the leaf each
 * tree reaches and the forest's raw score (baseLogit plus the reached leaf
 * values, summed in tree order), over feature-major or row-major input in the
 * contract's terms. The scorer runs the very same kernels.
 *
 * @example
 * const evaluator = new ForestEvaluator(forest, contract);
 * const leaves = evaluator.leaves(columns); // rowCount * trees leaf numbers in [0, 2^depth)
 * const raw = evaluator.rawScores(columns); // log-odds per row
 */
export class ForestEvaluator {
  readonly forest: ForestModel;
  private readonly compiled: CompiledForest;
  private readonly plan: InputPlan;
  private readonly valueCount: Int32Array;
  private readonly chunk: number;
  private readonly block: Float64Array;
  private readonly codes: Int32Array;

  /** Checks the forest against the contract (throws a ScorerError naming every problem) and compiles it. */
  constructor(forest: ForestModel, contract: FeatureContract) {
    const issues = checkForestModel(forest, contract);
    if (issues.length > 0) throw new ScorerError("forest", issues);
    const encoding = { hashBits: 1, hashSeed: 0, hashed: [], crosses: [], numeric: [] };
    this.forest = forest;
    const virtual = VirtualSlots.plan([forest], contract);
    this.compiled = compileForest(forest, contract, virtual);
    this.plan = compileInputs(contract, encoding, encodedLayout([forest], encoding), virtual);
    this.valueCount = Int32Array.from(contract.categorical, (c) => c.values.length);
    this.chunk = chunkRows(this.plan.stride);
    this.block = allocateRowBlock(this.plan, this.chunk);
    this.codes = new Int32Array(this.chunk * this.plan.stride);
  }

  /** Row i's leaf number for tree t at out[i * trees + t]. */
  leaves(input: ForestColumns | ForestRows, out?: Int32Array): Int32Array {
    const treeCount = this.compiled.treeCount;
    const leaves = out ?? new Int32Array(input.rowCount * treeCount);
    this.check(input, leaves.length, input.rowCount * treeCount);
    for (let start = 0; start < input.rowCount; start += this.chunk) {
      const count = Math.min(this.chunk, input.rowCount - start);
      fillForestInput(this.plan, this.valueCount, input, start, count, this.block, this.codes);
      forestKernel(
        this.compiled,
        this.block,
        this.codes,
        this.plan.stride,
        count,
        leaves,
        treeCount,
        start * treeCount,
        0,
        0,
      );
    }
    return leaves;
  }

  /** baseLogit plus the reached leaf values, per row. */
  rawScores(input: ForestColumns | ForestRows, out?: Float64Array): Float64Array {
    const { treeCount, leaves: leafCount, leafValue, baseLogit } = this.compiled;
    const scores = out ?? new Float64Array(input.rowCount);
    const leaves = this.leaves(input);
    for (let i = 0; i < input.rowCount; i++) {
      let sum = baseLogit;
      for (let t = 0; t < treeCount; t++)
        sum += leafValue[t * leafCount + leaves[i * treeCount + t]];
      scores[i] = sum;
    }
    return scores;
  }

  private check(input: ForestColumns | ForestRows, outLength: number, needed: number): void {
    const plan = this.plan;
    const problems: string[] = [];
    if (outLength < needed) problems.push(`output expected ${needed} entries, found ${outLength}`);
    if ("values" in input) {
      if (input.values.length < input.rowCount * plan.featureCount) {
        problems.push(
          `values expected ${input.rowCount * plan.featureCount} entries, found ${input.values.length}`,
        );
      }
    } else {
      if (input.numeric.length !== plan.numericNames.length)
        problems.push(
          `expected ${plan.numericNames.length} numeric columns, found ${input.numeric.length}`,
        );
      if (input.categorical.length !== plan.categoricalNames.length)
        problems.push(
          `expected ${plan.categoricalNames.length} categorical columns, found ${input.categorical.length}`,
        );
      [...input.numeric, ...input.categorical].forEach((column, k) => {
        if (column.length < input.rowCount)
          problems.push(`column ${k} expected ${input.rowCount} rows, found ${column.length}`);
      });
    }
    if (problems.length > 0) {
      throw new ScorerError(
        "forest",
        problems.map((message) => ({ code: "input_shape", path: "", message })),
      );
    }
  }
}
