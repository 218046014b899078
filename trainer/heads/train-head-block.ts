import { ftrlWeight } from "./ftrl-weight.js";
import type { FtrlRule, HeadBlock, KernelBatch } from "./head-block.js";
import { HeadRowOutcomes } from "./head-row-outcomes.js";

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
  const { z, n, heads, stride, offset } = block;
  const hb = heads.length;
  const { rowCount, offsets, index, value } = batch;
  const invAlpha = 1 / rule.alpha;
  const beta = rule.beta;
  const lambda1 = rule.lambda1;
  const lambda2 = rule.lambda2;
  const biasBase = rule.biasCoordinate * stride + offset;

  const outcomes = new HeadRowOutcomes(heads, rule);
  outcomes.begin(batch, block);
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

    const trains = outcomes.row(r, logit, grad);
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
