import { describe, expect, it } from "vitest";
import type { ForestModel } from "../../scorer/model-types.js";
import { LeafcastError } from "../../trainer/errors.js";
import { decodeHeadState } from "../../trainer/heads/decode-head-state.js";
import { encodeHeadState } from "../../trainer/heads/encode-head-state.js";
import { fingerprintForests } from "../../trainer/heads/fingerprint-forests.js";
import { fingerprintSchema } from "../../trainer/heads/fingerprint-schema.js";
import { learnHeads } from "../../trainer/heads/learn-heads.js";
import { resolveDatasetSchema } from "../../trainer/schema/load-dataset-schema.js";
import { encodedRows, headBatch, headSetup, sameBits } from "./head-fixtures.js";

const outcomes = ["open", "react", "reply", "save", "reshare", "hide"];

function codeOf(run: () => unknown): string {
  try {
    run();
  } catch (error) {
    if (error instanceof LeafcastError) return error.code;
    throw error;
  }
  return "no error";
}

describe("head-state file", () => {
  it("stores six heads over 2^20 hashed buckets in what the data touched", async () => {
    // Six heads over 6400 leaf slots plus 2^20 buckets is 2 x 8 x 6 x ~1.05M = 101 MB
    // as dense float64; the file keeps only coordinates with a non-zero z or n.
    const indexSize = 6400 + 2 ** 20;
    const rows = Array.from({ length: 2000 }, (_, r) => [r % 6400, 6400 + ((r * 7919) % 2 ** 20)]);
    const labels = outcomes.map((_, h) => rows.map((_, r) => ((r + h) % 5 === 0 ? 1 : 0)));
    const timestamps = Float64Array.from(rows, (_, r) => 1.7e12 + r * 60_000);
    const setup = headSetup(outcomes, indexSize, { negativeKeepRate: { hide: 0.25 } });
    const state = await learnHeads(
      [headBatch(encodedRows(rows), labels, null, timestamps)],
      setup,
      { workers: 0 },
    );
    const bytes = encodeHeadState(state);
    // 4001 stored coordinates (2000 leaves, 2000 buckets, the bias): 4001 x (4 + 6 x 16)
    // bytes = 400 kB, plus the header.
    expect(bytes.length).toBeGreaterThan(400_000);
    expect(bytes.length).toBeLessThan(410_000);
    const back = decodeHeadState(bytes);
    expect(sameBits(back.z, state.z)).toBe(true);
    expect(sameBits(back.n, state.n)).toBe(true);
    expect(back.info).toEqual(state.info);
    expect(back.rowCount).toBe(2000);
    expect([back.firstTimestamp, back.lastTimestamp]).toEqual([1.7e12, 1.7e12 + 1999 * 60_000]);
    expect(sameBits(back.progressive.overall, state.progressive.overall)).toBe(true);
    expect(back.progressive.sliceIndexes).toEqual(state.progressive.sliceIndexes);

    // A reader refuses damaged files with a coded error, never a half-read state.
    expect(codeOf(() => decodeHeadState(bytes.subarray(0, bytes.length - 8)))).toBe("truncated");
    expect(codeOf(() => decodeHeadState(new TextEncoder().encode('{"not": "a state"}')))).toBe(
      "not_head_state",
    );
    const wrongVersion = bytes.slice();
    new DataView(wrongVersion.buffer).setUint32(8, 9, true);
    expect(codeOf(() => decodeHeadState(wrongVersion))).toBe("unsupported_version");
    // A misaligned copy (as a Buffer slice may be) still decodes.
    const shifted = new Uint8Array(bytes.length + 1).subarray(1);
    shifted.set(bytes);
    expect(sameBits(decodeHeadState(shifted).z, state.z)).toBe(true);
  });
});

describe("fingerprints", () => {
  const forest = (threshold: number): ForestModel => ({
    outcome: "open",
    baseLogit: -1.5,
    depth: 1,
    trees: [
      {
        feature: Int32Array.of(0),
        threshold: Float64Array.of(threshold),
        missingRight: Uint8Array.of(0),
        rightCategories: [null],
        leafValue: Float64Array.of(-0.1, 0.2),
      },
    ],
  });

  it("tell trees apart by every split, not by how they were stored", () => {
    expect(fingerprintForests([forest(3.5)])).toBe(fingerprintForests([forest(3.5)]));
    expect(fingerprintForests([forest(3.5)])).not.toBe(fingerprintForests([forest(3.25)]));
    expect(fingerprintForests([forest(3.5)])).toMatch(/^sha256:[0-9a-f]{64}$/);
  });

  it("tell schemas apart by columns and roles only", () => {
    const schema = (role: string, description: string): string =>
      fingerprintSchema(
        resolveDatasetSchema({
          name: "plots",
          columns: [
            { name: "tie_strength", role, description },
            { name: "open", role: "outcome" },
          ],
        }),
      );
    expect(schema("numeric", "a")).toBe(schema("numeric", "b"));
    expect(schema("numeric", "a")).not.toBe(schema("categorical", "a"));
  });
});
