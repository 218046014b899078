import type { FeatureContract } from "../../scorer/model-types.js";

/**
 * The inputs of tree fitting held in memory, column by column. Missing numbers
 * are NaN (other numbers must be finite); missing categories are code -1 (codes
 * index `dictionary`).
 *
 * @example
 * const input: TreeInput = {
 *   rowCount: 3,
 *   numeric: [{ name: "tie_strength", values: Float64Array.of(0.2, NaN, 0.9) }],
 *   categorical: [{ name: "crop", codes: Int32Array.of(0, 1, -1), dictionary: ["leek", "kale"] }],
 * };
 */
export interface TreeInput {
  readonly rowCount: number;
  readonly numeric: readonly { readonly name: string; readonly values: Float64Array }[];
  readonly categorical: readonly {
    readonly name: string;
    readonly codes: Int32Array;
    readonly dictionary: readonly string[];
  }[];
}

/**
 * The features as the tree learner sees them: one byte per row and binned column,
 * row-major in one Uint8Array (row r, column c at r * columnCount + c) over a
 * SharedArrayBuffer so that worker threads read it without copies.
 *
 * Bin layout per column: value bins 0 .. valueBins[c] - 1, then one missing bin
 * (index valueBins[c]). Numeric columns: bin b holds edges[b - 1] < x <= edges[b].
 * Categorical columns: bin = the category's code in the feature contract.
 *
 * @example
 * const binned = binFeatures(input, { bins: 255, binSampleRows: 200_000, maxCategories: 32, seed: 1 });
 * binned.bins[r * binned.columnCount + c]; // bin of row r in column c
 */
export interface BinnedFeatures {
  readonly rowCount: number;
  /** Every input feature: numeric first, then categorical (high-cardinality ones with no values). */
  readonly contract: FeatureContract;
  readonly columnCount: number;
  readonly bins: Uint8Array;
  /** Per binned column: its feature index in the contract. */
  readonly columnFeature: Int32Array;
  /** Per binned column: 1 for a categorical column, 0 for numeric. */
  readonly columnCategorical: Uint8Array;
  /** Per binned column: number of value bins (the missing bin follows them). */
  readonly valueBins: Int32Array;
  /** Per binned column: upper bin edges of a numeric column (the last is Number.MAX_VALUE); null for categorical. */
  readonly edges: readonly (Float64Array | null)[];
}
