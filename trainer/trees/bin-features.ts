import type { CategoricalFeature } from "../../scorer/model-types.js";
import { binCategoryColumn, binNumericColumn, padEdges } from "./bin-kernels.js";
import { checkBinningInput } from "./check-binning-input.js";
import type { BinnedFeatures, TreeInput } from "./binned-features.js";
import { quantileBinEdges } from "./quantile-bin-edges.js";
import { SeededRandom } from "./seeded-random.js";

export interface BinningOptions {
  /** Value bins per numeric feature, 2..255 (one more bin holds missing values). */
  readonly bins: number;
  /** Rows sampled (seeded, without replacement) to place the numeric bin edges. */
  readonly binSampleRows: number;
  /** Categorical features with 1..maxCategories distinct codes are binned by code; others stay out of the trees. */
  readonly maxCategories: number;
  readonly seed: number;
}

/**
 * Bins every feature once, for all forests fitted on these rows. Numeric
 * features get quantile edges from a seeded row sample; categorical features
 * with few distinct values are binned by code; wider ones are left to the heads.
 *
 * @example
 * const binned = binFeatures(input, { bins: 255, binSampleRows: 200_000, maxCategories: 32, seed: 1 });
 * binned.contract.numeric; // the numeric feature names, in input order
 */
export function binFeatures(input: TreeInput, options: BinningOptions): BinnedFeatures {
  checkBinningInput(input, options);
  const n = input.rowCount;
  const sample = sampleRows(n, Math.min(n, options.binSampleRows), options.seed);

  const edges: (Float64Array | null)[] = [];
  for (const column of input.numeric) {
    const values = new Float64Array(sample.length);
    let kept = 0;
    for (let i = 0; i < sample.length; i++) {
      const x = column.values[sample[i]];
      if (x === x) values[kept++] = x;
    }
    edges.push(quantileBinEdges(values.subarray(0, kept).sort(), options.bins));
  }

  const categorical: CategoricalFeature[] = [];
  const nativeColumns: { codes: Int32Array; binOfCode: Int32Array; feature: number }[] = [];
  input.categorical.forEach((column, j) => {
    const binOfCode = nativeBins(column.codes, column.dictionary.length, options.maxCategories);
    const values: string[] = [];
    if (binOfCode !== null) {
      for (let code = 0; code < binOfCode.length; code++) {
        if (binOfCode[code] >= 0) values.push(column.dictionary[code]);
      }
      nativeColumns.push({ codes: column.codes, binOfCode, feature: input.numeric.length + j });
    }
    categorical.push({ name: column.name, values });
  });

  const numericCount = input.numeric.length;
  const columnCount = numericCount + nativeColumns.length;
  const bins = new Uint8Array(
    new SharedArrayBuffer(Math.max(1, n * columnCount)),
    0,
    n * columnCount,
  );
  const columnFeature = new Int32Array(columnCount);
  const columnCategorical = new Uint8Array(columnCount);
  const valueBins = new Int32Array(columnCount);
  for (let c = 0; c < numericCount; c++) {
    const columnEdges = edges[c] as Float64Array;
    columnFeature[c] = c;
    valueBins[c] = columnEdges.length;
    binNumericColumn(
      input.numeric[c].values,
      padEdges(columnEdges),
      bins,
      columnCount,
      c,
      columnEdges.length,
    );
  }
  nativeColumns.forEach((column, k) => {
    const c = numericCount + k;
    const categories = categorical[column.feature - numericCount].values.length;
    columnFeature[c] = column.feature;
    columnCategorical[c] = 1;
    valueBins[c] = categories;
    edges.push(null);
    binCategoryColumn(column.codes, column.binOfCode, bins, columnCount, c, categories);
  });

  return {
    rowCount: n,
    contract: { numeric: input.numeric.map((column) => column.name), categorical },
    columnCount,
    bins,
    columnFeature,
    columnCategorical,
    valueBins,
    edges,
  };
}

/** Dictionary code to contract code (-1 when absent), or null when the feature has too many (or no) values. */
function nativeBins(
  codes: Int32Array,
  dictionarySize: number,
  maxCategories: number,
): Int32Array | null {
  const seen = new Uint8Array(dictionarySize);
  let distinct = 0;
  for (let r = 0; r < codes.length; r++) {
    const code = codes[r];
    if (code >= 0 && seen[code] === 0) {
      seen[code] = 1;
      if (++distinct > maxCategories) return null;
    }
  }
  if (distinct === 0) return null;
  const binOfCode = new Int32Array(dictionarySize).fill(-1);
  for (let code = 0, next = 0; code < dictionarySize; code++) {
    if (seen[code] === 1) binOfCode[code] = next++;
  }
  return binOfCode;
}

/** Ascending row indexes of a seeded uniform sample without replacement (selection sampling). */
function sampleRows(n: number, k: number, seed: number): Uint32Array {
  const rows = new Uint32Array(k);
  if (k === n) {
    for (let i = 0; i < n; i++) rows[i] = i;
    return rows;
  }
  const random = new SeededRandom(seed);
  let taken = 0;
  for (let i = 0; i < n && taken < k; i++) {
    if (random.nextFloat() * (n - i) < k - taken) rows[taken++] = i;
  }
  return rows;
}
