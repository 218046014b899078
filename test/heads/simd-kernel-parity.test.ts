import { describe, expect, it } from "vitest";
import type { HeadBlock, KernelBatch } from "../../trainer/heads/head-block.js";
import { HeadState } from "../../trainer/heads/head-state.js";
import { makeFtrlRule } from "../../trainer/heads/make-ftrl-rule.js";
import { packLabels } from "../../trainer/heads/pack-labels.js";
import { createSimdHeadBlock } from "../../trainer/heads/simd/create-simd-head-block.js";
import { mergeSimdHeadBlock } from "../../trainer/heads/simd/merge-simd-head-block.js";
import { SimdHeadKernel } from "../../trainer/heads/simd/simd-head-kernel.js";
import { trainHeadBlock } from "../../trainer/heads/train-head-block.js";
import type { HeadSettings } from "../../trainer/schema/load-training-config.js";
import { headSetup, uniform } from "./head-fixtures.js";

// The WebAssembly kernel must give the same bits as the JavaScript kernel
// (train-head-block.ts), which test/heads/textbook-ftrl.test.ts checks against a
// plain FTRL-Proximal written from McMahan et al. 2013, Algorithm 1. Both do the
// same IEEE 754 double operations in the same order (WebAssembly's f64x2 lanes
// round as scalar doubles do: the WebAssembly SIMD specification), so any
// difference is a bug. The cases cover every unrolled width (1-12 heads), padding
// lanes, hash collisions (repeated coordinates, adjacent or not), numeric values, sample
// weights, time slices, L1 and L2, beta 0 and both downsampling corrections.

interface Case {
  readonly heads: number;
  readonly values: boolean;
  readonly weights: boolean;
  readonly settings: Partial<HeadSettings>;
}

// Ten pages of coordinates (COORDINATE_PAGE_SHIFT 9), the upper ones rarely reached.
const INDEX_SIZE = 5000;

function randomBatch(random: () => number, rows: number, c: Case, rowBase: number): KernelBatch {
  const offsets = new Uint32Array(rows + 1);
  const index: number[] = [];
  const value: number[] = [];
  for (let r = 0; r < rows; r++) {
    const length = 1 + Math.floor(random() * 40);
    const row = Array.from({ length }, () => Math.floor(random() * random() * INDEX_SIZE));
    // The encoder writes collisions side by side; half the rows here leave them apart.
    if (random() < 0.5) row.sort((a, b) => a - b);
    for (const i of row) {
      index.push(i);
      value.push(random() < 0.2 ? 0 : (random() - 0.5) * 6);
    }
    offsets[r + 1] = index.length;
  }
  const labels = Array.from({ length: c.heads }, (_, h) =>
    Uint8Array.from({ length: rows }, () => (random() < 0.1 + 0.1 * h ? 1 : 0)),
  );
  const packed = new Uint8Array(rows * c.heads);
  packLabels(labels, rows, packed);
  return {
    rowCount: rows,
    offsets,
    index: Int32Array.from(index),
    value: c.values ? Float64Array.from(value) : null,
    labels: packed,
    weights: c.weights ? Float64Array.from({ length: rows }, () => 0.2 + 3 * random()) : null,
    slots: Int32Array.from({ length: rows }, (_, r) => Math.floor(((rowBase + r) / 150) % 3)),
    rowBase,
    maxRowLength: Math.max(...Array.from({ length: rows }, (_, r) => offsets[r + 1] - offsets[r])),
  };
}

function run(c: Case): void {
  const outcomes = Array.from({ length: c.heads }, (_, h) => `outcome${h}`);
  const setup = headSetup(outcomes, INDEX_SIZE, { outcomes, ...c.settings });
  const plain = HeadState.create(setup);
  const simd = HeadState.create(setup);
  const rule = makeFtrlRule(plain.info);
  // Three daily slices, registered before the block copies the sums; rows cycle through them.
  for (const state of [plain, simd]) {
    state.progressive.assignSlots(
      Float64Array.from([0, 1, 2], (d) => d * 86_400_000),
      3,
      new Int32Array(3),
    );
    state.progressive.ensureCapacity();
  }
  const random = uniform(c.heads * 97 + (c.values ? 1 : 0) + (c.weights ? 2 : 0));
  let rowBase = 0;
  // Two runs of three batches, each run on a new block copied from the state (as
  // a resumed or updated state is): the second copy takes only the pages the
  // first marked, so a page-map slip shows as different bits.
  for (let run = 0; run < 2; run++) {
    const block = createSimdHeadBlock(simd, 0, c.heads);
    const kernel = new SimdHeadKernel(block, rule);
    for (let b = 0; b < 3; b++) {
      const batch = randomBatch(random, 120 + 60 * b, c, rowBase);
      const plainBlock: HeadBlock = {
        heads: Int32Array.from({ length: c.heads }, (_, h) => h),
        stride: c.heads,
        offset: 0,
        z: plain.z,
        n: plain.n,
        overall: plain.progressive.overall,
        sliceStats: plain.progressive.sliceStats,
      };
      trainHeadBlock(plainBlock, rule, batch);
      kernel.train(batch);
      rowBase += batch.rowCount;
    }
    mergeSimdHeadBlock(simd, block);
  }
  expect(Buffer.from(simd.z.buffer).equals(Buffer.from(plain.z.buffer)), "z").toBe(true);
  expect(Buffer.from(simd.n.buffer).equals(Buffer.from(plain.n.buffer)), "n").toBe(true);
  expect(Array.from(simd.progressive.overall)).toEqual(Array.from(plain.progressive.overall));
  expect(Array.from(simd.progressive.sliceStats)).toEqual(Array.from(plain.progressive.sliceStats));
  // Not a vacuous comparison: the heads learned something.
  expect(plain.z.some((v) => v !== 0)).toBe(true);
}

describe("the WebAssembly FTRL kernel", () => {
  for (const heads of [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12]) {
    it(`gives the JavaScript kernel's bits for ${heads} heads`, () => {
      run({
        heads,
        values: heads % 2 === 0,
        weights: heads % 3 === 0,
        settings: {
          alpha: 0.08,
          beta: heads === 5 ? 0 : 1,
          lambda1: heads % 4 === 1 ? 0 : 0.3,
          lambda2: 0.7,
          negativeKeepRate: heads > 2 ? { outcome0: 0.25, outcome2: 0.5 } : {},
          downsampleCorrection: heads % 2 === 0 ? "weight" : "recalibrate",
        },
      });
    });
  }
});
