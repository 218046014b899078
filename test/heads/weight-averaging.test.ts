import { describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import { decodeHeadState } from "../../trainer/heads/decode-head-state.js";
import { encodeHeadState } from "../../trainer/heads/encode-head-state.js";
import { exportHeadModels } from "../../trainer/heads/export-head-models.js";
import type { HeadState } from "../../trainer/heads/head-state.js";
import { learnHeads } from "../../trainer/heads/learn-heads.js";
import { updateHeads } from "../../trainer/heads/update-heads.js";
import type { HeadModel } from "../../scorer/model-types.js";
import {
  batchesOf,
  headSetup,
  sameBits,
  syntheticDays,
  syntheticIndexSize,
} from "./head-fixtures.js";

// What is checked: exported weights under heads.averaging are the exponential
// moving average of the weights snapshotted every `everyRows` rows, each
// snapshot's share 1 - 2^(-everyRows / halfLifeRows), divided by the shares'
// sum (the bias correction of an average started at zero; common practice), the
// rows since the last snapshot folded in with their own share, exported where
// the latest weight is non-zero (L1 keeps choosing the features). The expected
// average is recomputed here from the latest weights of a run WITHOUT
// averaging, read at the same rows, by the textbook recurrence; averaging must
// not change z and n; and a run resumed from a saved file averages exactly as
// an uninterrupted one.
const days = 3;
const rowsPerDay = 2000;
const rows = syntheticDays(5, days, rowsPerDay, 3);
const total = days * rowsPerDay;
const settings = {
  alpha: 0.1,
  lambda1: 0.2,
  lambda2: 1,
  negativeKeepRate: { reply: 0.5 },
  sliceHours: 6,
};
const averaging = { halfLifeRows: 1500, everyRows: 500 };
const plain = headSetup(["open", "reply", "hide"], syntheticIndexSize(), settings);
const averaged = headSetup(["open", "reply", "hide"], syntheticIndexSize(), {
  ...settings,
  averaging,
});

function dense(head: HeadModel, size: number): Float64Array {
  const w = new Float64Array(size + 1);
  head.index.forEach((c, k) => (w[c] = head.weight[k]));
  w[size] = head.bias;
  return w;
}

describe("weight averaging", () => {
  it("exports the bias-corrected moving average of snapshots every everyRows rows", async () => {
    const size = syntheticIndexSize();
    const snapshots: Float64Array[][] = [];
    // Batches of 250 rows end on every multiple of 500, where the checkpoint hook reads the latest weights.
    const latest = await learnHeads(batchesOf(rows, 0, total - 123, 250), plain, {
      workers: 0,
      everyRows: averaging.everyRows,
      onCheckpoint: (s) => {
        snapshots.push(exportHeadModels(s).map((h) => dense(h, size)));
      },
    });
    const finalLatest = exportHeadModels(latest).map((h) => dense(h, size));
    // Batches of 700 rows straddle the snapshot rows, so learnHeads has to cut them.
    const state = await learnHeads(batchesOf(rows, 0, total - 123, 700), averaged, {
      workers: 2,
    });
    expect(sameBits(state.z, latest.z)).toBe(true);
    expect(sameBits(state.n, latest.n)).toBe(true);

    const share = (r: number): number => 1 - 2 ** (-r / averaging.halfLifeRows);
    const exported = exportHeadModels(state).map((h) => dense(h, size));
    expect(snapshots.length).toBe(Math.floor((total - 123) / averaging.everyRows));
    for (let h = 0; h < 3; h++) {
      const expected = new Float64Array(size + 1);
      let mass = 0;
      for (const snapshot of snapshots) {
        const s = share(averaging.everyRows);
        for (let c = 0; c <= size; c++) expected[c] = (1 - s) * expected[c] + s * snapshot[h][c];
        mass = (1 - s) * mass + s;
      }
      const s = share((total - 123) % averaging.everyRows);
      for (let c = 0; c <= size; c++) {
        expected[c] =
          finalLatest[h][c] === 0
            ? 0
            : ((1 - s) * expected[c] + s * finalLatest[h][c]) / ((1 - s) * mass + s);
      }
      let differs = 0;
      for (let c = 0; c <= size; c++) {
        const scale = Math.max(1e-3, Math.abs(expected[c]));
        if (Math.abs(exported[h][c] - expected[c]) > 1e-12 * scale) differs++;
      }
      // Some weights L1 set to zero had been non-zero at a snapshot: they stay out.
      const dropped = snapshots.some((snap) =>
        snap[h].some((w, c) => w !== 0 && finalLatest[h][c] === 0),
      );
      expect(dropped, `head ${h}: a weight L1 zeroed after a snapshot`).toBe(true);
      expect(differs, `head ${h}: coordinates off the recurrence`).toBe(0);
      // The average lags the latest weights: it is a different, smoother head.
      expect(sameBits(exported[h], finalLatest[h])).toBe(false);
    }
  });

  it("averages to the same bits on 0 to 3 threads, with either kernel", async () => {
    // Five heads: WebAssembly blocks of 4 + 1 heads (the second with a padding lane), JavaScript blocks of views or copies.
    const outcomes = ["open", "react", "reply", "save", "hide"];
    const five = syntheticDays(9, 2, 2000, outcomes.length);
    const setup = headSetup(outcomes, syntheticIndexSize(), {
      ...settings,
      negativeKeepRate: { react: 0.3 },
      averaging: { halfLifeRows: 900, everyRows: 300 },
    });
    const run = (
      workers: number,
      kernel: "simd" | "js",
      callerTrains = false,
    ): Promise<HeadState> =>
      learnHeads(batchesOf(five, 0, 4000, 650), setup, { workers, kernel, callerTrains });
    const reference = await run(0, "js");
    expect(reference.averageMass).toBeGreaterThan(0.9);
    for (const kernel of ["simd", "js"] as const) {
      for (const workers of [0, 1, 2, 3]) {
        for (const callerTrains of workers >= 2 ? [false, true] : [false]) {
          const state = await run(workers, kernel, callerTrains);
          const label = `${kernel}, ${workers} threads${callerTrains ? ", caller trains" : ""}`;
          expect(
            sameBits(state.average as Float64Array, reference.average as Float64Array),
            label,
          ).toBe(true);
          expect(state.averageMass, label).toBe(reference.averageMass);
        }
      }
    }
  });

  it("resumes from a saved state exactly as one uninterrupted run", async () => {
    const expectSame = (a: HeadState, b: HeadState): void => {
      expect(sameBits(a.z, b.z)).toBe(true);
      expect(sameBits(a.n, b.n)).toBe(true);
      expect(sameBits(a.average as Float64Array, b.average as Float64Array)).toBe(true);
      expect(a.averageMass).toBe(b.averageMass);
      expect(a.rowCount).toBe(b.rowCount);
    };
    const straight = await learnHeads(batchesOf(rows, 0, total, 1000), averaged, { workers: 0 });
    // Stop between snapshots (2,345 is no multiple of 500) and go through the file format.
    const first = await learnHeads(batchesOf(rows, 0, 2345, 600), averaged, { workers: 1 });
    const saved = decodeHeadState(encodeHeadState(first));
    expect(saved.averageMass).toBe(first.averageMass);
    expect(saved.averageMass).toBeGreaterThan(0);
    const resumed = await updateHeads(saved, batchesOf(rows, 2345, total, 900), averaged, {
      workers: 2,
    });
    expectSame(resumed, straight);
    const [a, b] = [exportHeadModels(resumed), exportHeadModels(straight)];
    a.forEach((head, h) => {
      expect(sameBits(head.weight, b[h].weight)).toBe(true);
      expect(head.bias).toBe(b[h].bias);
    });
  });

  it("refuses to resume under other averaging, and reads files from before averaging", async () => {
    const state = await learnHeads(batchesOf(rows, 0, 1000, 500), averaged, { workers: 0 });
    const other = headSetup(["open", "reply", "hide"], syntheticIndexSize(), {
      ...settings,
      averaging: { halfLifeRows: 3000, everyRows: 500 },
    });
    for (const setup of [other, plain]) {
      const error = await learnHeads([], setup, { state, workers: 0 }).catch((e: unknown) => e);
      expect(error).toBeInstanceOf(LeafcastError);
      expect((error as LeafcastError).issues.map((i) => i.code)).toContain("settings_changed");
      expect((error as LeafcastError).message).toContain("averaging");
    }
    // A version-1 file: a version-2 file without averaging, save for the version
    // numbers and a header without info.averaging (rewritten here, space-padded
    // to its old length as the format pads it).
    const bytes = encodeHeadState(
      await learnHeads(batchesOf(rows, 0, 1000, 500), plain, { workers: 0 }),
    );
    const view = new DataView(bytes.buffer);
    const headerBytes = view.getUint32(12, true);
    const header = JSON.parse(new TextDecoder().decode(bytes.subarray(16, 16 + headerBytes))) as {
      version: number;
      info: Record<string, unknown>;
    };
    header.version = 1;
    delete header.info.averaging;
    const text = new TextEncoder().encode(JSON.stringify(header));
    bytes.fill(0x20, 16, 16 + headerBytes);
    bytes.set(text, 16);
    view.setUint32(8, 1, true);
    const old = decodeHeadState(bytes);
    expect(old.info.averaging).toBeNull();
    expect(old.average).toBeNull();
    // A header whose version differs from the file's is refused.
    view.setUint32(8, 2, true);
    expect(() => decodeHeadState(bytes)).toThrow(/header's version/);
  });
});
