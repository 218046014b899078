/** Small builders shared by the head tests (not a test file itself). */
import type { EncodedBatch, EncodingSpec } from "../../scorer/model-types.js";
import type { HeadBatch, HeadSetup } from "../../trainer/heads/head-setup.js";
import type { HeadSettings } from "../../trainer/schema/load-training-config.js";

export const noEncoding: EncodingSpec = {
  hashBits: 0,
  hashSeed: 0,
  hashed: [],
  crosses: [],
  numeric: [],
};

export function headSettings(overrides: Partial<HeadSettings> = {}): HeadSettings {
  return {
    outcomes: null,
    alpha: 0.1,
    beta: 1,
    lambda1: 0,
    lambda2: 0,
    hashBits: 0,
    hashSeed: 0,
    hashed: [],
    crosses: [],
    numeric: [],
    negativeKeepRate: {},
    downsampleCorrection: "recalibrate",
    sliceHours: 24,
    averaging: null,
    ...overrides,
  };
}

export function headSetup(
  outcomes: readonly string[],
  indexSize: number,
  settings: Partial<HeadSettings> = {},
  extra: Partial<HeadSetup> = {},
): HeadSetup {
  return {
    outcomes,
    settings: headSettings(settings),
    encoding: noEncoding,
    indexSize,
    seed: 7,
    treesFingerprint: "sha256:trees",
    schemaFingerprint: "sha256:schema",
    ...extra,
  };
}

/** A CSR batch from per-row index lists (and optional per-row values). */
export function encodedRows(
  indexes: readonly (readonly number[])[],
  values?: readonly (readonly number[])[],
): EncodedBatch {
  const offsets = new Uint32Array(indexes.length + 1);
  indexes.forEach((row, r) => (offsets[r + 1] = offsets[r] + row.length));
  return {
    rowCount: indexes.length,
    offsets,
    index: Int32Array.from(indexes.flat()),
    value: values === undefined ? null : Float64Array.from(values.flat()),
  };
}

export function headBatch(
  encoded: EncodedBatch,
  labels: readonly (readonly number[] | Uint8Array)[],
  weights: Float64Array | null = null,
  timestamps: Float64Array | null = null,
): HeadBatch {
  return { encoded, labels: labels.map((l) => Uint8Array.from(l)), weights, timestamps };
}

/** Deterministic uniform numbers in [0, 1) (a 32-bit LCG; common practice, constants of Numerical Recipes). */
export function uniform(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296;
  };
}

/** Rows of a small leaf-like problem over some days, kept as plain arrays so tests can re-cut them into batches. */
export interface SyntheticRows {
  readonly indexes: number[][];
  readonly labels: number[][];
  readonly weights: number[];
  readonly timestamps: number[];
}

export const DAY_MS = 86_400_000;

/** `trees` trees of 16 leaves (one leaf each per row) plus 2 hashed buckets out of 256; heads' rates differ. */
export function syntheticDays(
  seed: number,
  days: number,
  rowsPerDay: number,
  heads: number,
  trees = 8,
): SyntheticRows {
  const random = uniform(seed);
  const leafSlots = trees * 16;
  const rows: SyntheticRows = {
    indexes: [],
    labels: Array.from({ length: heads }, () => []),
    weights: [],
    timestamps: [],
  };
  for (let d = 0; d < days; d++) {
    for (let i = 0; i < rowsPerDay; i++) {
      const row: number[] = [];
      let signal = 0;
      for (let t = 0; t < trees; t++) {
        const leaf = Math.floor(random() * random() * 16);
        row.push(t * 16 + leaf);
        signal += (leaf - 4) / 16;
      }
      const a = leafSlots + Math.floor(random() * 128);
      const b = leafSlots + 128 + Math.floor(random() * 128);
      row.push(a, b);
      rows.indexes.push(row);
      for (let h = 0; h < heads; h++) {
        const logit = -1 - h + signal * (h % 2 === 0 ? 1 : -1) + 0.1 * d;
        rows.labels[h].push(random() < 1 / (1 + Math.exp(-logit)) ? 1 : 0);
      }
      rows.weights.push(random() < 0.1 ? 2 : 1);
      rows.timestamps.push(19_000 * DAY_MS + d * DAY_MS + Math.floor((i / rowsPerDay) * DAY_MS));
    }
  }
  return rows;
}

/** Index-space size of syntheticDays rows. */
export function syntheticIndexSize(trees = 8): number {
  return trees * 16 + 256;
}

/** Rows [from, to) cut into batches of `size` rows. */
export function batchesOf(
  rows: SyntheticRows,
  from: number,
  to: number,
  size: number,
): HeadBatch[] {
  const batches: HeadBatch[] = [];
  for (let start = from; start < to; start += size) {
    const end = Math.min(to, start + size);
    batches.push(
      headBatch(
        encodedRows(rows.indexes.slice(start, end)),
        rows.labels.map((l) => l.slice(start, end)),
        Float64Array.from(rows.weights.slice(start, end)),
        Float64Array.from(rows.timestamps.slice(start, end)),
      ),
    );
  }
  return batches;
}

/** Bitwise equality of two typed arrays (equal NaN payloads and signed zeros included). */
export function sameBits(a: ArrayBufferView, b: ArrayBufferView): boolean {
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength).equals(
    Buffer.from(b.buffer, b.byteOffset, b.byteLength),
  );
}
