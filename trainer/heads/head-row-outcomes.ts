import type { FtrlRule, KernelBatch } from "./head-block.js";
import { negativeKeepDraw } from "./negative-keep-draw.js";
import {
  STAT_FIELDS,
  STAT_LOSS,
  STAT_POSITIVE,
  STAT_PREDICTED,
  STAT_ROWS,
  STAT_WEIGHT,
} from "./progressive-stats.js";

const TWO_POW_32 = 4294967296;

/** Where a block's progressive sums live: [slot][stride][STAT_FIELDS], its heads from `offset`. */
export interface BlockSums {
  readonly overall: Float64Array;
  readonly sliceStats: Float64Array;
  readonly stride: number;
  readonly offset: number;
}

/**
 * The per-row step between scoring a row and training on it, for the heads of
 * one block, shared by every training kernel: from each head's logit, the
 * progressive-validation loss of the served probability (before training on the
 * row; McMahan et al. 2013), the running sums, the downsampling decision and the
 * gradient (p - y) scaled by the sample weight (and 1/rate for kept negatives
 * under "weight"). A head that skips the row gets gradient 0.
 *
 * @example
 * outcomes.begin(batch, sums);
 * for (let r = 0; r < batch.rowCount; r++) {
 *   // ... logits of row r into `logit` ...
 *   if (outcomes.row(r, logit, grad)) {
 *     // ... update z and n with `grad` ...
 *   }
 * }
 */
export class HeadRowOutcomes {
  private readonly heads: Int32Array;
  private readonly seed: number;
  private readonly keepThreshold: Float64Array;
  private readonly negativeWeight: Float64Array;
  private readonly servingShift: Float64Array;
  private readonly labelOffset: Int32Array;
  private batch: KernelBatch | null = null;
  private sums: BlockSums | null = null;

  constructor(heads: Int32Array, rule: FtrlRule) {
    const hb = heads.length;
    this.heads = heads;
    this.seed = rule.seed;
    this.keepThreshold = new Float64Array(hb);
    this.negativeWeight = new Float64Array(hb);
    this.servingShift = new Float64Array(hb);
    this.labelOffset = new Int32Array(hb);
    for (let h = 0; h < hb; h++) {
      const rate = rule.keepRate[heads[h]];
      this.keepThreshold[h] = rate * TWO_POW_32;
      this.negativeWeight[h] = rule.weightNegatives ? 1 / rate : 1;
      this.servingShift[h] = rule.weightNegatives ? 0 : Math.log(rate);
    }
  }

  /** Starts a batch whose sums go to `sums`. */
  begin(batch: KernelBatch, sums: BlockSums): void {
    this.batch = batch;
    this.sums = sums;
    for (let h = 0; h < this.heads.length; h++) {
      this.labelOffset[h] = this.heads[h] * batch.rowCount;
    }
  }

  /**
   * Row r of the batch, its logits in logit[0 .. heads): adds to the sums and
   * writes grad[0 .. heads); true when any head trains on the row.
   */
  row(r: number, logit: Float64Array, grad: Float64Array): boolean {
    const batch = this.batch as KernelBatch;
    const { overall, sliceStats, stride, offset } = this.sums as BlockSums;
    const { labels, weights, slots, rowBase } = batch;
    const { keepThreshold, negativeWeight, servingShift, labelOffset, heads, seed } = this;
    const weight = weights === null ? 1 : weights[r];
    const slot = slots === null ? -1 : slots[r];
    let trains = false;
    for (let h = 0; h < heads.length; h++) {
      const y = labels[labelOffset[h] + r];
      const m = logit[h];
      // Progressive validation on the served probability: logit shifted by ln(rate) under "recalibrate".
      const served = m + servingShift[h];
      const e = Math.exp(-Math.abs(served));
      const q = served >= 0 ? 1 / (1 + e) : e / (1 + e);
      const loss = Math.max(y === 1 ? -served : served, 0) + Math.log1p(e);
      let at = (offset + h) * STAT_FIELDS;
      overall[at + STAT_LOSS] += weight * loss;
      overall[at + STAT_WEIGHT] += weight;
      overall[at + STAT_PREDICTED] += weight * q;
      overall[at + STAT_POSITIVE] += weight * y;
      overall[at + STAT_ROWS] += 1;
      if (slot >= 0) {
        at = (slot * stride + offset + h) * STAT_FIELDS;
        sliceStats[at + STAT_LOSS] += weight * loss;
        sliceStats[at + STAT_WEIGHT] += weight;
        sliceStats[at + STAT_PREDICTED] += weight * q;
        sliceStats[at + STAT_POSITIVE] += weight * y;
        sliceStats[at + STAT_ROWS] += 1;
      }
      const keep =
        y === 1 ||
        keepThreshold[h] >= TWO_POW_32 ||
        negativeKeepDraw(rowBase + r, heads[h], seed) < keepThreshold[h];
      if (keep) {
        const p = servingShift[h] === 0 ? q : 1 / (1 + Math.exp(-m));
        grad[h] = (y === 1 ? weight : weight * negativeWeight[h]) * (p - y);
        trains = true;
      } else {
        grad[h] = 0;
      }
    }
    return trains;
  }
}
