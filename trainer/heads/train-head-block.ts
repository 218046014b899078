import { ftrlWeight } from "./ftrl-weight.js";
import type { FtrlRule, HeadBlock, KernelBatch } from "./head-block.js";
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

/**
 * One pass of FTRL-Proximal (McMahan et al. 2013, Algorithm 1) over a batch for
 * the heads of one block, all heads of a coordinate together. Per row: compute
 * every head's weights of the row's coordinates (kept in scratch), its logit, its
 * progressive-validation loss with the served probability (before training on
 * the row), the downsampling decision, then the z and n updates with the
 * gradient (p - y) x scaled by the sample weight (and 1/rate for kept negatives
 * under "weight"). The bias has the same per-coordinate rate but no L1 or L2.
 * Entries of a row with the same index (hash collisions) must be adjacent, as
 * the encoder writes them; each is applied in turn.
 *
 * The only allocations are scratch arrays per call, none per row.
 *
 * @example
 * trainHeadBlock(block, rule, batch); // advances block.z, block.n and its sums
 */
export function trainHeadBlock(block: HeadBlock, rule: FtrlRule, batch: KernelBatch): void {
  const { z, n, overall, sliceStats, heads, stride, offset } = block;
  const hb = heads.length;
  const { rowCount, offsets, index, value, labels, weights, slots, rowBase } = batch;
  const invAlpha = 1 / rule.alpha;
  const beta = rule.beta;
  const lambda1 = rule.lambda1;
  const lambda2 = rule.lambda2;
  const seed = rule.seed;
  const biasBase = rule.biasCoordinate * stride + offset;

  const keepThreshold = new Float64Array(hb);
  const negativeWeight = new Float64Array(hb);
  const servingShift = new Float64Array(hb);
  const labelOffset = new Int32Array(hb);
  for (let h = 0; h < hb; h++) {
    const rate = rule.keepRate[heads[h]];
    keepThreshold[h] = rate * TWO_POW_32;
    negativeWeight[h] = rule.weightNegatives ? 1 / rate : 1;
    servingShift[h] = rule.weightNegatives ? 0 : Math.log(rate);
    labelOffset[h] = heads[h] * rowCount;
  }
  const wScratch = new Float64Array(Math.max(1, batch.maxRowLength) * hb);
  const sScratch = new Float64Array(wScratch.length);
  const biasW = new Float64Array(hb);
  const biasS = new Float64Array(hb);
  const logit = new Float64Array(hb);
  const grad = new Float64Array(hb);

  let touched = 0;
  for (let r = 0; r < rowCount; r++) {
    const start = offsets[r];
    const end = offsets[r + 1];
    // Read the next row's coordinates now: hashed buckets are scattered over
    // tens of MB, and loads issued a row ahead overlap their cache misses with
    // this row's work (JavaScript has no prefetch instruction; a plain load is one).
    const next = r + 1 < rowCount ? offsets[r + 2] : end;
    for (let k = end; k < next; k++) {
      const base = index[k] * stride + offset;
      touched += z[base] + n[base];
    }
    for (let h = 0; h < hb; h++) {
      const s = Math.sqrt(n[biasBase + h]);
      const w = ftrlWeight(z[biasBase + h], s, invAlpha, beta, 0, 0);
      biasS[h] = s;
      biasW[h] = w;
      logit[h] = w;
    }
    for (let k = start, o = 0; k < end; k++, o += hb) {
      const x = value === null ? 1 : value[k];
      const base = index[k] * stride + offset;
      for (let h = 0; h < hb; h++) {
        const s = Math.sqrt(n[base + h]);
        const w = ftrlWeight(z[base + h], s, invAlpha, beta, lambda1, lambda2);
        sScratch[o + h] = s;
        wScratch[o + h] = w;
        logit[h] += w * x;
      }
    }

    const weight = weights === null ? 1 : weights[r];
    const slot = slots === null ? -1 : slots[r];
    let trains = false;
    for (let h = 0; h < hb; h++) {
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
    // A head with gradient 0 leaves z and n bit for bit unchanged below, so only
    // a row that trains no head of the block can skip the update pass.
    if (!trains) continue;

    for (let h = 0; h < hb; h++) {
      const g = grad[h];
      const i = biasBase + h;
      const n1 = n[i] + g * g;
      z[i] += g - (Math.sqrt(n1) - biasS[h]) * invAlpha * biasW[h];
      n[i] = n1;
    }
    for (let k = start, o = 0; k < end; k++, o += hb) {
      const x = value === null ? 1 : value[k];
      const base = index[k] * stride + offset;
      // A repeated index (two hashed features in one bucket; the encoder puts
      // them side by side) is updated again from its new n, with the weight the
      // row was scored with, as Algorithm 1 applies one gradient per entry.
      const repeated = k > start && index[k] === index[k - 1];
      for (let h = 0; h < hb; h++) {
        const g = grad[h] * x;
        const i = base + h;
        const n0 = n[i];
        const n1 = n0 + g * g;
        const s0 = repeated ? Math.sqrt(n0) : sScratch[o + h];
        z[i] += g - (Math.sqrt(n1) - s0) * invAlpha * wScratch[o + h];
        n[i] = n1;
      }
    }
  }
  // An observable store, so the compiler keeps the early loads above.
  prefetchSink[0] = touched;
}

const prefetchSink = new Float64Array(1);
