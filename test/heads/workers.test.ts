import { describe, expect, it } from "vitest";
import { learnHeads } from "../../trainer/heads/learn-heads.js";
import { LeafcastError } from "../../trainer/errors.js";
import {
  batchesOf,
  headSetup,
  sameBits,
  syntheticDays,
  syntheticIndexSize,
} from "./head-fixtures.js";

// Splitting heads over worker threads must not change any number: each head sees
// the same rows in the same order whatever thread owns it (a property of the
// design, checked bit for bit; hourly slices make the slice table grow mid-run).
const rows = syntheticDays(5, 3, 2000, 5);
const setup = headSetup(["open", "react", "reply", "save", "hide"], syntheticIndexSize(), {
  alpha: 0.1,
  lambda1: 0.1,
  lambda2: 1,
  negativeKeepRate: { save: 0.3, hide: 0.1 },
  downsampleCorrection: "weight",
  sliceHours: 1,
});

describe("heads on worker threads", () => {
  it("gives bit for bit the same state with 0, 1, 2 and 3 threads and either kernel", async () => {
    const inline = await learnHeads(batchesOf(rows, 0, 6000, 1024), setup, { workers: 0 });
    expect(inline.progressive.sliceCount).toBe(72);
    for (const [workers, kernel, workerCopies, callerTrains] of [
      [0, "js", true, false],
      [1, "simd", true, false],
      [2, "simd", true, false],
      [2, "simd", true, true],
      [3, "simd", true, true],
      [3, "simd", true, false],
      [2, "js", true, false],
      [2, "js", false, false],
      [2, "js", true, true],
    ] as const) {
      const threaded = await learnHeads(batchesOf(rows, 0, 6000, 1024), setup, {
        workers,
        kernel,
        workerCopies,
        callerTrains,
      });
      expect(sameBits(threaded.z, inline.z)).toBe(true);
      expect(sameBits(threaded.n, inline.n)).toBe(true);
      expect(sameBits(threaded.progressive.overall, inline.progressive.overall)).toBe(true);
      const used = 72 * 5 * 5;
      expect(
        sameBits(
          threaded.progressive.sliceStats.subarray(0, used),
          inline.progressive.sliceStats.subarray(0, used),
        ),
      ).toBe(true);
      expect(threaded.rowCount).toBe(6000);
    }
  });

  it("checkpoints a consistent state from workers", async () => {
    const seen: number[] = [];
    const inline = await learnHeads(batchesOf(rows, 0, 3000, 1000), setup, { workers: 0 });
    await learnHeads(batchesOf(rows, 0, 6000, 1000), setup, {
      workers: 2,
      everyRows: 3000,
      onCheckpoint: (state) => {
        if (state.rowCount === 3000) {
          seen.push(state.rowCount);
          expect(sameBits(state.z, inline.z)).toBe(true);
        }
      },
    });
    expect(seen).toEqual([3000]);
  });

  it("rejects a bad batch before any thread trains on it", async () => {
    const [good] = batchesOf(rows, 0, 10, 10);
    const bad = {
      ...good,
      encoded: { ...good.encoded, index: good.encoded.index.map((i) => i + 10_000) },
    };
    const error = await learnHeads([good, bad], setup, { workers: 2 }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(LeafcastError);
    expect((error as LeafcastError).code).toBe("bad_index");
    expect((error as LeafcastError).message).toBe(
      "heads: batch 2: expected encoded indexes in [0, 384), found 10002 at entry 0 (and 99 more)",
    );
  });
});
