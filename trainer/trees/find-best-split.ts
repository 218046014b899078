import { COLUMN_SLOTS, SLOT_VALUES } from "./histogram-kernel.js";

/** Limits on splits: L2 on leaf values, the smallest leaf hessian, the smallest gain. */
export interface SplitRules {
  readonly l2: number;
  readonly minLeafHessian: number;
  readonly minSplitGain: number;
}

/** What split search needs to know of the binned columns (histograms: see accumulateHistogram). */
export interface HistogramLayout {
  readonly columnCount: number;
  readonly valueBins: Int32Array;
  readonly columnCategorical: Uint8Array;
}

/** The best split of a node, in bins. */
export interface SplitChoice {
  readonly column: number;
  /** GL^2/(HL + l2) + GR^2/(HR + l2) - G^2/(H + l2). */
  readonly gain: number;
  /** Numeric: value bins <= threshold go left. -1 for a categorical split. */
  readonly threshold: number;
  readonly missingRight: boolean;
  /** Categorical: the value bins (contract codes) that go right, ascending; null for numeric. */
  readonly rightBins: Uint8Array | null;
  readonly left: { readonly gradient: number; readonly hessian: number };
  readonly right: { readonly gradient: number; readonly hessian: number };
}

/**
 * Scans a node histogram (gradient and hessian sums per bin, see
 * accumulateHistogram) for the split with the largest gain
 * GL^2/(HL + l2) + GR^2/(HR + l2) - G^2/(H + l2) (second-order boosting gain with L2
 * on leaf values, common practice). Numeric columns try every threshold with
 * missing rows left and right. Categorical columns order their categories by
 * G/(H + l2) and scan that order: for a binary target this finds the best
 * two-way grouping among all 2^(k-1) (Fisher 1958 for the squared-error case).
 * Both sides must hold rows: a bin holds rows when its sums are not both zero
 * (every row with a weight above 0 has a hessian above 0), and the sides are
 * told apart by counting such bins, which is exact where a difference of float
 * sums is not. Returns null when no split beats minSplitGain and the leaf limits.
 * Ties keep the first column and the lowest threshold, so the choice is
 * deterministic.
 *
 * @example
 * const choice = findBestSplit(hist, layout, null, G, H, { l2: 1, minLeafHessian: 1e-3, minSplitGain: 0 });
 * choice?.column; // binned column of the best split
 */
export function findBestSplit(
  hist: Float64Array,
  layout: HistogramLayout,
  allowed: Uint8Array | null,
  gradient: number,
  hessian: number,
  rules: SplitRules,
): SplitChoice | null {
  const { l2, minLeafHessian } = rules;
  const parent = hessian + l2 > 0 ? (gradient * gradient) / (hessian + l2) : 0;
  // A split must gain more than rounding noise: when gradients are proportional to
  // hessians (nothing to learn) the exact gain is <= 0, but sums may leave ~1e-16 of it.
  let bestGain = Math.max(rules.minSplitGain, 1e-10 * parent);
  let best: SplitChoice | null = null;

  const gainOf = (gl: number, hl: number): number => {
    const hr = hessian - hl;
    if (hl < minLeafHessian || hr < minLeafHessian) return -Infinity;
    const dl = hl + l2;
    const dr = hr + l2;
    if (!(dl > 0 && dr > 0)) return -Infinity;
    const gr = gradient - gl;
    return (gl * gl) / dl + (gr * gr) / dr - parent;
  };
  const choose = (
    column: number,
    gain: number,
    threshold: number,
    missingRight: boolean,
    rightBins: Uint8Array | null,
    gl: number,
    hl: number,
  ): void => {
    bestGain = gain;
    best = {
      column,
      gain,
      threshold,
      missingRight,
      rightBins,
      left: { gradient: gl, hessian: hl },
      right: { gradient: gradient - gl, hessian: hessian - hl },
    };
  };

  for (let c = 0; c < layout.columnCount; c++) {
    if (allowed !== null && allowed[c] === 0) continue;
    const base = SLOT_VALUES * COLUMN_SLOTS * c;
    const bins = layout.valueBins[c];
    const miss = base + SLOT_VALUES * bins;
    const mg = hist[miss];
    const mh = hist[miss + 1];
    const hasMissing = mg !== 0 || mh !== 0;
    // Value bins that hold rows (present.length of them), in bin order.
    const present: number[] = [];
    for (let t = 0; t < bins; t++) {
      const k = base + SLOT_VALUES * t;
      if (hist[k] !== 0 || hist[k + 1] !== 0) present.push(t);
    }
    if (layout.columnCategorical[c] === 0) {
      let gl = 0;
      let hl = 0;
      // Thresholds at bins without rows give the same partition as the one before.
      for (let p = 0; p < present.length; p++) {
        const t = present[p];
        const k = base + SLOT_VALUES * t;
        gl += hist[k];
        hl += hist[k + 1];
        const valuesRight = p < present.length - 1;
        if (valuesRight || hasMissing) {
          const right = gainOf(gl, hl);
          // Without missing rows in the node, unseen missing values follow the heavier side.
          if (right > bestGain) choose(c, right, t, hasMissing || hessian - hl > hl, null, gl, hl);
        }
        if (hasMissing && valuesRight) {
          const left = gainOf(gl + mg, hl + mh);
          if (left > bestGain) choose(c, left, t, false, null, gl + mg, hl + mh);
        }
      }
      continue;
    }
    // Categorical: order the present categories by G / (H + l2), then scan prefixes.
    const ratio = (t: number): number => {
      const d = hist[base + SLOT_VALUES * t + 1] + l2;
      return d > 0 ? hist[base + SLOT_VALUES * t] / d : 0;
    };
    present.sort((a, b) => ratio(a) - ratio(b) || a - b);
    let gl = 0;
    let hl = 0;
    for (let k = 0; k < present.length; k++) {
      const at = base + SLOT_VALUES * present[k];
      gl += hist[at];
      hl += hist[at + 1];
      const valuesRight = k < present.length - 1;
      if (valuesRight || hasMissing) {
        const right = gainOf(gl, hl);
        if (right > bestGain) {
          const missingRight = hasMissing || hessian - hl > hl;
          choose(c, right, -1, missingRight, rightOf(present, k), gl, hl);
        }
      }
      if (hasMissing && valuesRight) {
        const left = gainOf(gl + mg, hl + mh);
        if (left > bestGain) choose(c, left, -1, false, rightOf(present, k), gl + mg, hl + mh);
      }
    }
  }
  return best;
}

/** The categories after position k of the scan order, ascending. */
function rightOf(order: readonly number[], k: number): Uint8Array {
  return Uint8Array.from(order.slice(k + 1)).sort();
}

/**
 * Writes a split as a 256-entry table (1 where a bin goes right) at `base`.
 *
 * @example
 * const table = new Uint8Array(256);
 * writeSplitTable(choice, layout.valueBins[choice.column], table, 0);
 */
export function writeSplitTable(
  choice: SplitChoice,
  valueBins: number,
  table: Uint8Array,
  base: number,
): void {
  table.fill(0, base, base + 256);
  if (choice.rightBins === null) {
    for (let b = choice.threshold + 1; b < valueBins; b++) table[base + b] = 1;
  } else {
    for (let i = 0; i < choice.rightBins.length; i++) table[base + choice.rightBins[i]] = 1;
  }
  table[base + valueBins] = choice.missingRight ? 1 : 0;
}
