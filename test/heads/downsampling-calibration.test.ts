import { describe, expect, it } from "vitest";
import type { HeadModel } from "../../scorer/model-types.js";
import { exportHeadModels } from "../../trainer/heads/export-head-models.js";
import { learnHeads } from "../../trainer/heads/learn-heads.js";
import { progressiveReport } from "../../trainer/heads/progressive-report.js";
import { recalibrate } from "../../trainer/heads/recalibrate.js";
import type { HeadBatch } from "../../trainer/heads/head-setup.js";
import { encodedRows, headBatch, headSetup, uniform } from "./head-fixtures.js";

// Source for the corrections: McMahan et al., KDD 2013 (weight kept negatives 1/r)
// and He et al., ADKDD 2014 (re-calibrate q = p / (p + (1 - p) / r)); calibration =
// mean predicted / observed rate, 1 is perfect (He et al. 2014).
const levelsA = 12;
const levelsB = 6;

/** Rows with one of 12 "A" levels and one of 6 "B" levels; known true probability, base rate ~4 %. */
function synthetic(seed: number, rows: number): HeadBatch {
  const random = uniform(seed);
  const effectA = Array.from({ length: levelsA }, (_, a) => ((a * 7) % levelsA) / levelsA - 0.5);
  const effectB = Array.from({ length: levelsB }, (_, b) => (b % 3) * 0.4 - 0.4);
  const indexes: number[][] = [];
  const labels: number[] = [];
  for (let r = 0; r < rows; r++) {
    const a = Math.floor(random() * levelsA);
    const b = Math.floor(random() * levelsB);
    const p = 1 / (1 + Math.exp(-(-3.3 + effectA[a] + effectB[b])));
    indexes.push([a, levelsA + b]);
    labels.push(random() < p ? 1 : 0);
  }
  return headBatch(encodedRows(indexes), [labels]);
}

function meanServed(head: HeadModel, batch: HeadBatch): number {
  const { rowCount, offsets, index } = batch.encoded;
  const weights = new Map<number, number>();
  head.index.forEach((j, k) => weights.set(j, head.weight[k]));
  let sum = 0;
  for (let r = 0; r < rowCount; r++) {
    let logit = head.bias;
    for (let k = offsets[r]; k < offsets[r + 1]; k++) logit += weights.get(index[k]) ?? 0;
    sum += recalibrate(1 / (1 + Math.exp(-logit)), head.negativeKeepRate);
  }
  return sum / rowCount;
}

describe("negative downsampling 10x stays calibrated on unsampled rows", () => {
  const training = synthetic(1, 300_000);
  const heldOut = synthetic(2, 300_000);
  const heldLabels = heldOut.labels[0];
  const observed = heldLabels.reduce((sum, y) => sum + y, 0) / heldLabels.length;

  for (const correction of ["weight", "recalibrate"] as const) {
    it(`with the "${correction}" correction`, async () => {
      const setup = headSetup(["reshare"], levelsA + levelsB, {
        // alpha 0.2: with much smaller rates the bias still carries its start at
        // p = 0.5 after 300k rows (0.965 at alpha = 0.05, no downsampling at all).
        alpha: 0.2,
        lambda1: 0,
        lambda2: 1,
        negativeKeepRate: { reshare: 0.1 },
        downsampleCorrection: correction,
      });
      const state = await learnHeads([training], setup, { workers: 0 });
      const [head] = exportHeadModels(state);
      expect(head.negativeKeepRate).toBe(correction === "recalibrate" ? 0.1 : 1);
      const calibration = meanServed(head, heldOut) / observed;
      expect(calibration).toBeGreaterThan(0.97);
      expect(calibration).toBeLessThan(1.03);
      // Progressive validation scored every training row, dropped negatives included.
      const [report] = progressiveReport(state);
      expect(report.overall.rows).toBe(300_000);
      expect(report.overall.calibration).toBeGreaterThan(0.97);
      expect(report.overall.calibration).toBeLessThan(1.03);
    });
  }
});
