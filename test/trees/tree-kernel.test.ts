import { describe, expect, it } from "vitest";
import { addTreeToScores } from "../../trainer/trees/add-tree-to-scores.js";
import { accumulateHistogram } from "../../trainer/trees/histogram-kernel.js";
import { logLossGradients } from "../../trainer/trees/log-loss-gradients.js";
import { partitionRows } from "../../trainer/trees/partition-rows.js";
import { TreeKernel } from "../../trainer/trees/simd/tree-kernel.js";
import { testRandom } from "./tree-test-helpers.js";

// The WebAssembly kernel against the JavaScript kernels it replaces, bit for bit
// on random input. The WebAssembly specification defines f64x2.add lane by lane
// as IEEE 754 double addition (round to nearest even), the rounding of
// JavaScript's + (common practice), so a (gradient, hessian) pair added as one
// vector must equal two scalar additions in the same order.
const PAGE = 65536;

/** A shared memory with `bytes` for the test's arrays and room for one thread's scratch. */
function kernelMemory(bytes: number): WebAssembly.Memory {
  const initial = Math.ceil(bytes / PAGE);
  return new WebAssembly.Memory({ initial, maximum: initial + 64, shared: true });
}

/** Doubles of mixed signs and magnitudes, so that the order of additions shows in the bits. */
function randomPairs(random: () => number, length: number): Float64Array {
  return Float64Array.from(
    { length },
    () => (random() - 0.4) * 10 ** Math.floor(random() * 12 - 6),
  );
}

function bits(values: Float64Array): BigUint64Array {
  return new BigUint64Array(
    values.buffer.slice(values.byteOffset, values.byteOffset + values.byteLength),
  );
}

describe("WebAssembly tree kernel", () => {
  it.each([1, 3, 4, 5, 8, 9, 12, 13, 16, 17, 24, 31, 40])(
    "sums the same histogram bits as accumulateHistogram (%i columns)",
    (columns) => {
      const random = testRandom(100 + columns);
      const rows = 3000;
      const stride = 4 * Math.ceil(columns / 4);
      const histLength = 2 * 256 * columns;
      const orderedAt = 16 * Math.ceil((rows * stride) / 16);
      const histAt = orderedAt + 16 * rows;
      const memory = kernelMemory(histAt + 8 * histLength);
      const placed = new Uint8Array(memory.buffer, 0, rows * stride);
      const ordered = new Float64Array(memory.buffer, orderedAt, 2 * rows);
      const hist = new Float64Array(memory.buffer, histAt, histLength);
      // Few distinct bins in some columns, so that slots take many additions.
      for (let i = 0; i < placed.length; i++) {
        placed[i] = Math.floor(random() * (i % 3 === 0 ? 4 : 256));
      }
      ordered.set(randomPairs(random, 2 * rows));
      const kernel = new TreeKernel(memory, 0, stride);
      for (const [start, end] of [
        [0, rows],
        [17, 1290],
        [2999, 3000],
        [5, 5],
      ]) {
        const expected = randomPairs(random, histLength);
        hist.set(expected);
        accumulateHistogram(placed, stride, columns, start, end, ordered, expected);
        kernel.histogram(0, stride, columns, start, end, orderedAt, histAt);
        expect(bits(hist)).toEqual(bits(expected));
      }
    },
  );

  it.each([1, 4, 5, 8, 9, 12, 16, 20, 25, 32])(
    "moves rows as partitionRows does (%i columns)",
    (columns) => {
      const random = testRandom(200 + columns);
      const rows = 2000;
      const stride = 4 * Math.ceil(columns / 4);
      const orderedAt = 16 * Math.ceil((rows * stride) / 16);
      const tableAt = orderedAt + 16 * rows;
      const memory = kernelMemory(tableAt + 3 * 256);
      const placed = new Uint8Array(memory.buffer, 0, rows * stride);
      const ordered = new Float64Array(memory.buffer, orderedAt, 2 * rows);
      const tables = new Uint8Array(memory.buffer, tableAt, 3 * 256);
      const kernel = new TreeKernel(memory, rows, stride);
      expect(kernel.partition).not.toBeNull();
      for (let i = 0; i < placed.length; i++) placed[i] = Math.floor(random() * 256);
      ordered.set(randomPairs(random, 2 * rows));
      for (let i = 0; i < tables.length; i++) tables[i] = random() < 0.4 ? 1 : 0;
      tables.fill(0, 256, 512); // a node whose rows all go left
      const jsPlaced = placed.slice();
      const jsWords = new Uint32Array(jsPlaced.buffer);
      const jsOrdered = ordered.slice();
      const gradScratch = new Float64Array(2 * rows);
      const wordScratch = new Uint32Array((rows * stride) / 4);
      for (const [start, end, node] of [
        [0, rows, 0],
        [100, 1500, 2],
        [1500, 2000, 1],
        [7, 8, 0],
        [9, 9, 2],
      ]) {
        const column = Math.floor(random() * columns);
        const expected = partitionRows(
          jsPlaced,
          jsWords,
          stride,
          jsOrdered,
          start,
          end,
          column,
          tables,
          256 * node,
          gradScratch,
          wordScratch,
        );
        const partition = kernel.partition as NonNullable<TreeKernel["partition"]>;
        const left = partition(0, orderedAt, start, end, column, tableAt + 256 * node) - start;
        expect(left).toBe(expected);
        expect(Buffer.from(placed).equals(Buffer.from(jsPlaced))).toBe(true);
        expect(bits(ordered)).toEqual(bits(jsOrdered));
      }
    },
  );

  it.each([
    { validation: false, position: -1 },
    { validation: false, position: 3 },
    { validation: true, position: -1 },
    { validation: true, position: 0 },
  ])(
    "computes the same gradient bits and loss sums as logLossGradients (validation $validation, position $position)",
    ({ validation, position }) => {
      const random = testRandom(validation ? 301 : 302);
      const rows = 2001;
      const scoreAt = 0;
      const labelAt = 8 * rows;
      const validationAt = labelAt + 16 * Math.ceil(rows / 16);
      const outAt = validationAt + 16 * Math.ceil(rows / 16);
      const memory = kernelMemory(outAt + 16 * (rows + position + 1));
      const score = new Float64Array(memory.buffer, scoreAt, rows);
      const label = new Uint8Array(memory.buffer, labelAt, rows);
      const valid = new Uint8Array(memory.buffer, validationAt, rows);
      const out = new Float64Array(memory.buffer, outAt, 2 * (rows + position + 1));
      // Scores over the whole range the kernel branches on: 0, tiny, ordinary, past
      // e < 2^-26 (|s| > 18), past exp's underflow (|s| > 745), and both signs.
      const pick = [0, -0, 1e-300, 3, -3, 20, -20, 40, 700, -744.9, 746, -800, 1e6];
      for (let r = 0; r < rows; r++) {
        score[r] = r % 7 === 0 ? pick[r % pick.length] : (random() - 0.5) * 10 ** (random() * 3);
        label[r] = random() < 0.4 ? 1 : 0;
        valid[r] = validation && random() < 0.2 ? 1 : 0;
      }
      const kernel = new TreeKernel(memory, 0, 4);
      const gradients = kernel.gradients as NonNullable<TreeKernel["gradients"]>;
      const expectedOut = randomPairs(random, out.length);
      out.set(expectedOut);
      const expectedSums = Float64Array.of(0.5, 2, 0.25, 1);
      const sums = expectedSums.slice();
      let expectedPacked = position;
      let packed = position;
      // Pieces of odd and even lengths, so that both the paired loop and the last lone row run.
      for (const [start, end] of [
        [0, 1],
        [1, 700],
        [700, 1301],
        [1301, 2001],
      ]) {
        expectedPacked = logLossGradients(
          score,
          label,
          null,
          validation ? valid : null,
          expectedOut,
          expectedPacked,
          start,
          end,
          expectedSums,
          0,
        );
        packed = gradients(
          scoreAt,
          labelAt,
          validation ? validationAt : 0,
          outAt,
          packed,
          start,
          end,
          sums,
          0,
        );
        expect(packed).toBe(expectedPacked);
        expect(bits(out)).toEqual(bits(expectedOut));
        expect(bits(sums)).toEqual(bits(expectedSums));
      }
    },
  );

  it.each([
    { columns: 3, depth: 1 },
    { columns: 8, depth: 6 },
    { columns: 13, depth: 4 },
  ])(
    "adds the same leaf values to scores as addTreeToScores ($columns columns, depth $depth)",
    ({ columns, depth }) => {
      const random = testRandom(400 + columns);
      const rows = 1003;
      const internal = 2 ** depth - 1;
      const binsAt = 0;
      const scoreAt = 16 * Math.ceil((rows * columns) / 16);
      const columnAt = scoreAt + 8 * rows;
      const tablesAt = columnAt + 16 * Math.ceil((4 * internal) / 16);
      const leafAt = tablesAt + 256 * internal;
      const memory = kernelMemory(leafAt + 8 * (internal + 1));
      const bins = new Uint8Array(memory.buffer, binsAt, rows * columns);
      const score = new Float64Array(memory.buffer, scoreAt, rows);
      const nodeColumn = new Int32Array(memory.buffer, columnAt, internal);
      const goesRight = new Uint8Array(memory.buffer, tablesAt, 256 * internal);
      const leafValue = new Float64Array(memory.buffer, leafAt, internal + 1);
      for (let i = 0; i < bins.length; i++) bins[i] = Math.floor(random() * 256);
      score.set(randomPairs(random, rows));
      for (let i = 0; i < internal; i++) nodeColumn[i] = Math.floor(random() * columns);
      for (let i = 0; i < goesRight.length; i++) goesRight[i] = random() < 0.5 ? 1 : 0;
      leafValue.set(randomPairs(random, internal + 1));
      const expected = score.slice();
      const kernel = new TreeKernel(memory, 0, 4 * Math.ceil(columns / 4));
      for (const [start, end] of [
        [0, 5],
        [5, 1003],
        [9, 9],
      ]) {
        addTreeToScores(
          bins,
          columns,
          start,
          end,
          depth,
          nodeColumn,
          goesRight,
          leafValue,
          expected,
        );
        kernel.traverse(binsAt, columns, start, end, depth, columnAt, tablesAt, leafAt, scoreAt);
        expect(bits(score)).toEqual(bits(expected));
      }
    },
  );

  it("leaves partitions of rows wider than 32 columns to JavaScript", () => {
    expect(new TreeKernel(kernelMemory(PAGE), 100, 36).partition).toBeNull();
  });
});
