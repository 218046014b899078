import { ONE_HOT_MAX_VALUES } from "./compile-inputs.js";
import type { FeatureContract, ForestModel } from "./model-types.js";

/**
 * Categorical splits turned into numeric ones. Each distinct (feature, codes that
 * go right, missing direction) of a covered forest gets a slot after the 2F
 * feature slots of the row block, filled per row with 1 when the row's value
 * goes right there and 0 otherwise; the node reads it with threshold 0.5, so the
 * numeric kernel serves the whole forest. Filling a row's slots copies, per
 * feature, the precomputed 0/1 row of its code from a table.
 *
 * A forest is covered when its categorical features have at most 31 values (a
 * split is then one 32-bit mask over code + 1, bit 0 for missing) and its
 * distinct splits are at most half the nodes a row visits (trees x depth): here
 * a slot cost about 2 ns per row and the categorical kernels about 1.1 ns more
 * per node visited than the numeric one.
 *
 * @example
 * const virtual = VirtualSlots.plan(forests, contract);
 * virtual.covers(forests[0]); // true for few, low-cardinality categorical splits
 */
export class VirtualSlots {
  /** Per group of slots (one categorical feature): its code-block slot (F + f) holding code + 1. */
  readonly groupCodeSlot: Int32Array;
  /** Per group: one past its last slot. */
  readonly groupEnd: Int32Array;
  /** Per slot: the bits of code + 1 that go right (bit 0: missing). */
  readonly mask: Int32Array;
  /** Per group: where its table starts; row code + 1 of the table holds the group's slot values (0 or 1) for that code. */
  readonly groupTable: Int32Array;
  readonly table: Float64Array;
  private readonly slotOf: ReadonlyMap<string, number>;
  private readonly covered: ReadonlySet<ForestModel>;
  private readonly featureCount: number;

  private constructor(
    featureCount: number,
    covered: ReadonlySet<ForestModel>,
    splits: readonly { categorical: number; key: string; mask: number }[],
    numericCount: number,
    valueCounts: readonly number[],
  ) {
    this.featureCount = featureCount;
    this.covered = covered;
    const sorted = [...splits].sort(
      (a, b) => a.categorical - b.categorical || (a.key < b.key ? -1 : 1),
    );
    const slotOf = new Map<string, number>();
    const groupCodeSlot: number[] = [];
    const groupEnd: number[] = [];
    sorted.forEach((split, v) => {
      slotOf.set(split.key, v);
      if (v === 0 || sorted[v - 1].categorical !== split.categorical) {
        groupCodeSlot.push(featureCount + numericCount + split.categorical);
        groupEnd.push(v + 1);
      } else {
        groupEnd[groupEnd.length - 1] = v + 1;
      }
    });
    this.slotOf = slotOf;
    this.groupCodeSlot = Int32Array.from(groupCodeSlot);
    this.groupEnd = Int32Array.from(groupEnd);
    this.mask = Int32Array.from(sorted, (split) => split.mask);
    const groupTable: number[] = [];
    const table: number[] = [];
    let first = 0;
    groupEnd.forEach((end, g) => {
      groupTable.push(table.length);
      const categorical = groupCodeSlot[g] - featureCount - numericCount;
      for (let code1 = 0; code1 <= valueCounts[categorical]; code1++) {
        for (let v = first; v < end; v++) table.push((this.mask[v] >>> code1) & 1);
      }
      first = end;
    });
    this.groupTable = Int32Array.from(groupTable);
    this.table = Float64Array.from(table);
  }

  /** Decides which forests to cover and numbers their splits. */
  static plan(forests: readonly ForestModel[], contract: FeatureContract): VirtualSlots {
    const numericCount = contract.numeric.length;
    const covered = new Set<ForestModel>();
    const splits = new Map<string, { categorical: number; key: string; mask: number }>();
    for (const forest of forests) {
      const nodes = (1 << forest.depth) - 1;
      const own = new Map<string, { categorical: number; key: string; mask: number }>();
      let eligible = true;
      for (const tree of forest.trees) {
        for (let n = 0; n < nodes && eligible; n++) {
          const f = tree.feature[n];
          if (f < numericCount) continue;
          const c = f - numericCount;
          if (contract.categorical[c].values.length > ONE_HOT_MAX_VALUES) eligible = false;
          const right = tree.rightCategories[n];
          const missingRight = tree.missingRight[n] === 1;
          const key = `${c}:${missingRight ? 1 : 0}:${right === null ? "" : right.join(",")}`;
          if (!own.has(key)) {
            let mask = missingRight ? 1 : 0;
            for (const code of right ?? []) mask |= 1 << (code + 1);
            own.set(key, { categorical: c, key, mask });
          }
        }
      }
      if (eligible && own.size > 0 && own.size <= (forest.trees.length * forest.depth) / 2) {
        covered.add(forest);
        for (const [key, split] of own) splits.set(key, split);
      }
    }
    return new VirtualSlots(
      numericCount + contract.categorical.length,
      covered,
      [...splits.values()],
      numericCount,
      contract.categorical.map((c) => c.values.length),
    );
  }

  get count(): number {
    return this.mask.length;
  }

  /** Whether the forest's categorical splits are served by slots. */
  covers(forest: ForestModel): boolean {
    return this.covered.has(forest);
  }

  /** The row-block slot of a split of a covered forest. */
  slotFor(categorical: number, right: Int32Array | null, missingRight: boolean): number {
    const key = `${categorical}:${missingRight ? 1 : 0}:${right === null ? "" : right.join(",")}`;
    const v = this.slotOf.get(key);
    if (v === undefined) throw new RangeError(`scorer: split ${key} has no virtual slot`);
    return 2 * this.featureCount + v;
  }
}
