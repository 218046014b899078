import type { EncodedLayout } from "./encoded-layout.js";
import type { EncodingSpec, FeatureContract } from "./model-types.js";
import type { VirtualSlots } from "./virtual-slots.js";

/**
 * How the scorer reads inputs, resolved once at load: feature names to indexes,
 * categorical texts to tree codes, the prefixes of every hashed key, the
 * standardization constants.
 *
 * The tree kernels read two row blocks of the same stride 2F (F features): numbers
 * (Float64Array) and categorical codes (Int32Array). For a numeric feature, number
 * slots f and F + f hold the same present value; a missing value is -Infinity in
 * slot f and +Infinity in slot F + f, so a node whose missing direction is right
 * reads slot F + f, a left one slot f, and `x > threshold` needs no missing-value
 * test; its code slots stay 0. For a categorical feature, code slot f holds the
 * one-hot bit 2^(code + 1) (features of at most 31 values; bit 0 means missing)
 * and code slot F + f holds code + 1 (0 means missing); its number slots stay 0.
 * Number slots 2F + v hold virtual slot v (see VirtualSlots): 1 when the row's
 * value goes right at that split, else 0, copied per feature from a row of the
 * virtual slots' table (see fillVirtualSlots).
 */
export interface InputPlan {
  readonly numericNames: readonly string[];
  readonly categoricalNames: readonly string[];
  readonly featureCount: number;
  /** Doubles per row of the row blocks: 2F plus the virtual slots, at least 2. */
  readonly stride: number;
  /** Virtual slots by feature group: the group's code slot, one past its last slot, where its table starts (see VirtualSlots). */
  readonly virtualGroupCodeSlot: Int32Array;
  readonly virtualGroupEnd: Int32Array;
  readonly virtualGroupTable: Int32Array;
  readonly virtualTable: Float64Array;
  /**
   * Views of the table's rows: group g's row for code + 1 = k is
   * virtualRows[virtualGroupFirstRow[g] + k]. Made once, so a fill copies with
   * TypedArray set (a cheaper call here than copyWithin) and allocates nothing.
   */
  readonly virtualRows: readonly Float64Array[];
  readonly virtualGroupFirstRow: Int32Array;
  /** Per categorical feature: tree code of each value. */
  readonly codeOf: readonly ReadonlyMap<string, number>[];
  /** Per categorical feature: 1 when its one-hot slot is written (at most 31 values). */
  readonly oneHot: Uint8Array;
  /** Per feature (numeric then categorical): 1 when the name is also an Object.prototype member, so an item must be read by own property. */
  readonly guardedName: Uint8Array;
  readonly hashSeed: number;
  readonly hashMask: number;
  readonly hashedOffset: number;
  /** Per hashed single feature: its categorical index and key prefix `${name}=`. */
  readonly hashedFeature: Int32Array;
  readonly hashedPrefix: readonly string[];
  /** Per cross: its categorical indexes and key prefixes [`${a}=`, `&${b}=`, ...]. */
  readonly crossFeatures: readonly Int32Array[];
  readonly crossPrefixes: readonly (readonly string[])[];
  /** Hashed entries per row at most: singles then crosses. */
  readonly hashedSlotCount: number;
  /** Per standardized slot: its numeric feature index, mean and std. */
  readonly standardizedFeature: Int32Array;
  readonly mean: Float64Array;
  readonly std: Float64Array;
  readonly numericOffset: number;
}

/** One-hot slots hold 2^(code + 1) in an int32 mask: codes 0..30. */
export const ONE_HOT_MAX_VALUES = 31;

/**
 * Resolves a checked contract and encoding (see checkScoringModel) into an InputPlan;
 * compile the forests first, with the same `virtual`, so every slot is known.
 *
 * @example
 * const plan = compileInputs(model.contract, model.encoding, encodedLayout(model.forests, model.encoding), virtual);
 * plan.stride; // 2 * (numeric + categorical features)
 */
export function compileInputs(
  contract: FeatureContract,
  encoding: EncodingSpec,
  layout: EncodedLayout,
  virtual: VirtualSlots | null = null,
): InputPlan {
  const numericNames = [...contract.numeric];
  const categoricalNames = contract.categorical.map((c) => c.name);
  const featureCount = numericNames.length + categoricalNames.length;
  const categoricalIndex = new Map(categoricalNames.map((name, j) => [name, j]));
  const numericIndex = new Map(numericNames.map((name, i) => [name, i]));
  const resolve = (index: Map<string, number>, name: string): number => {
    const found = index.get(name);
    if (found === undefined)
      throw new RangeError(`scorer: feature "${name}" is not in the contract`);
    return found;
  };
  const guardedName = new Uint8Array(featureCount);
  [...numericNames, ...categoricalNames].forEach((name, f) => {
    guardedName[f] = name in Object.prototype ? 1 : 0;
  });
  const rows = virtualTableRows(virtual);
  return {
    numericNames,
    categoricalNames,
    featureCount,
    stride: Math.max(2, 2 * featureCount + (virtual?.count ?? 0)),
    virtualGroupCodeSlot: virtual?.groupCodeSlot ?? new Int32Array(0),
    virtualGroupEnd: virtual?.groupEnd ?? new Int32Array(0),
    virtualGroupTable: virtual?.groupTable ?? new Int32Array(0),
    virtualTable: virtual?.table ?? new Float64Array(0),
    virtualRows: rows.views,
    virtualGroupFirstRow: rows.firstRow,
    codeOf: contract.categorical.map((c) => new Map(c.values.map((value, code) => [value, code]))),
    oneHot: Uint8Array.from(contract.categorical, (c) =>
      c.values.length <= ONE_HOT_MAX_VALUES ? 1 : 0,
    ),
    guardedName,
    hashSeed: encoding.hashSeed,
    hashMask: (1 << encoding.hashBits) - 1,
    hashedOffset: layout.hashedOffset,
    hashedFeature: Int32Array.from(encoding.hashed, (name) => resolve(categoricalIndex, name)),
    hashedPrefix: encoding.hashed.map((name) => `${name}=`),
    crossFeatures: encoding.crosses.map((cross) =>
      Int32Array.from(cross, (name) => resolve(categoricalIndex, name)),
    ),
    crossPrefixes: encoding.crosses.map((cross) =>
      cross.map((name, k) => `${k === 0 ? "" : "&"}${name}=`),
    ),
    hashedSlotCount: encoding.hashed.length + encoding.crosses.length,
    standardizedFeature: Int32Array.from(encoding.numeric, (entry) =>
      resolve(numericIndex, entry.name),
    ),
    mean: Float64Array.from(encoding.numeric, (entry) => entry.mean),
    std: Float64Array.from(encoding.numeric, (entry) => entry.std),
    numericOffset: layout.numericOffset,
  };
}

/** Views of each group's table rows, in group order (see InputPlan.virtualRows). */
function virtualTableRows(virtual: VirtualSlots | null): {
  views: Float64Array[];
  firstRow: Int32Array;
} {
  const views: Float64Array[] = [];
  if (virtual === null) return { views, firstRow: new Int32Array(0) };
  const groups = virtual.groupEnd.length;
  const firstRow = new Int32Array(groups);
  for (let g = 0; g < groups; g++) {
    const width = virtual.groupEnd[g] - (g === 0 ? 0 : virtual.groupEnd[g - 1]);
    const end = g + 1 < groups ? virtual.groupTable[g + 1] : virtual.table.length;
    firstRow[g] = views.length;
    for (let from = virtual.groupTable[g]; from < end; from += width)
      views.push(virtual.table.subarray(from, from + width));
  }
  return { views, firstRow };
}
