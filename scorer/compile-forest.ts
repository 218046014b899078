import { ONE_HOT_MAX_VALUES } from "./compile-inputs.js";
import type { VirtualSlots } from "./virtual-slots.js";
import type { FeatureContract, ForestModel } from "./model-types.js";

/** Which traversal kernel a forest needs. */
export type ForestKernel = "numeric" | "one-hot" | "bitset";

/**
 * A forest laid out for the branchless kernels: per node the row-block slot to
 * read and the threshold (pass-through and categorical nodes get +Infinity, so
 * `x > threshold` is false there), plus the categorical masks or bitsets.
 */
export interface CompiledForest {
  readonly outcome: string;
  readonly kernel: ForestKernel;
  readonly depth: number;
  /** Internal nodes per tree: 2^depth - 1. */
  readonly nodes: number;
  /** Leaves per tree: 2^depth. */
  readonly leaves: number;
  readonly treeCount: number;
  readonly baseLogit: number;
  /** Per node: the row-block slot it reads (missing direction folded in). */
  readonly offset: Int32Array;
  readonly threshold: Float64Array;
  /** One-hot kernel, per node: the one-hot bits that go right (0 at numeric nodes). */
  readonly mask: Int32Array;
  /** Bitset kernel, per node: first word of its region in `bits` (0, an all-zero region, at numeric nodes). */
  readonly bitsStart: Int32Array;
  readonly bits: Int32Array;
  /** Bitset kernel: 2^k - 1 covering every code + 1 of the forest's categorical features. */
  readonly codeMask: number;
  /** Per leaf of every tree (tree t's leaf k at t * leaves + k). */
  readonly leafValue: Float64Array;
}

/**
 * Lays out a checked forest (see checkScoringModel) for the traversal kernels.
 * The slot numbers assume the row block of the contract's InputPlan, built with
 * the same `virtual` slots: a forest they cover has its categorical splits read
 * as numeric ones (see VirtualSlots).
 *
 * @example
 * const compiled = compileForest(forests[0], contract);
 * compiled.kernel; // "numeric" when no node splits a categorical feature
 */
export function compileForest(
  forest: ForestModel,
  contract: FeatureContract,
  virtual: VirtualSlots | null = null,
): CompiledForest {
  const numericCount = contract.numeric.length;
  const featureCount = numericCount + contract.categorical.length;
  // Shifts, not 2 ** depth: `**` yields a heap number, and a kernel whose index
  // arithmetic sees one compiles to float math (a third slower here).
  const nodes = (1 << forest.depth) - 1;
  const leaves = nodes + 1;
  const treeCount = forest.trees.length;
  let maxValues = 0;
  let categoricalNodes = 0;
  for (const tree of forest.trees) {
    for (let n = 0; n < nodes; n++) {
      const f = tree.feature[n];
      if (f >= numericCount) {
        categoricalNodes++;
        maxValues = Math.max(maxValues, contract.categorical[f - numericCount].values.length);
      }
    }
  }
  const useVirtual = virtual !== null && categoricalNodes > 0 && virtual.covers(forest);
  const kernel: ForestKernel =
    categoricalNodes === 0 || useVirtual
      ? "numeric"
      : maxValues <= ONE_HOT_MAX_VALUES
        ? "one-hot"
        : "bitset";
  let codeMask = 0;
  while (codeMask < maxValues) codeMask = codeMask * 2 + 1; // covers code + 1 <= maxValues
  const regionWords = (codeMask >>> 5) + 1;
  const offset = new Int32Array(treeCount * nodes);
  const threshold = new Float64Array(treeCount * nodes);
  const mask = new Int32Array(kernel === "one-hot" ? treeCount * nodes : 0);
  const bitsStart = new Int32Array(kernel === "bitset" ? treeCount * nodes : 0);
  const bits = new Int32Array(kernel === "bitset" ? regionWords * (categoricalNodes + 1) : 0);
  const leafValue = new Float64Array(treeCount * leaves);
  let nextRegion = regionWords; // region 0 stays all zero for numeric nodes
  forest.trees.forEach((tree, t) => {
    leafValue.set(tree.leafValue, t * leaves);
    for (let n = 0; n < nodes; n++) {
      const j = t * nodes + n;
      const f = tree.feature[n];
      const missingRight = tree.missingRight[n] === 1;
      if (f < 0) {
        threshold[j] = Infinity; // pass-through: always left
      } else if (f < numericCount) {
        offset[j] = missingRight ? featureCount + f : f;
        threshold[j] = tree.threshold[n];
      } else if (useVirtual && virtual !== null) {
        offset[j] = virtual.slotFor(f - numericCount, tree.rightCategories[n], missingRight);
        threshold[j] = 0.5; // the slot holds 1 when the value goes right
      } else {
        threshold[j] = Infinity;
        const right = tree.rightCategories[n] ?? new Int32Array(0);
        if (kernel === "one-hot") {
          offset[j] = f;
          let bitsRight = missingRight ? 1 : 0;
          for (const code of right) bitsRight |= 1 << (code + 1);
          mask[j] = bitsRight;
        } else {
          offset[j] = featureCount + f;
          bitsStart[j] = nextRegion;
          if (missingRight) bits[nextRegion] |= 1;
          for (const code of right) bits[nextRegion + ((code + 1) >>> 5)] |= 1 << ((code + 1) & 31);
          nextRegion += regionWords;
        }
      }
    }
  });
  return {
    outcome: forest.outcome,
    kernel,
    depth: forest.depth,
    nodes,
    leaves,
    treeCount,
    baseLogit: forest.baseLogit,
    offset,
    threshold,
    mask,
    bitsStart,
    bits,
    codeMask,
    leafValue,
  };
}
