import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { rocAuc } from "../../trainer/metrics/roc-auc.js";

/** Mann-Whitney U over all positive-negative pairs, ties one half: the O(n^2) definition. */
function mannWhitneyAuc(p: ArrayLike<number>, y: ArrayLike<number>, w?: ArrayLike<number>): number {
  let credit = 0;
  let pairs = 0;
  for (let i = 0; i < p.length; i++) {
    if (y[i] !== 1) continue;
    for (let j = 0; j < p.length; j++) {
      if (y[j] !== 0) continue;
      const pair = (w?.[i] ?? 1) * (w?.[j] ?? 1);
      pairs += pair;
      credit += pair * (p[i] > p[j] ? 1 : p[i] === p[j] ? 0.5 : 0);
    }
  }
  return pairs > 0 ? credit / pairs : NaN;
}

/** Rows of small integer scores (many ties) with labels and integer weights. */
const rows = fc.array(
  fc.record({
    score: fc.integer({ min: 0, max: 12 }),
    label: fc.integer({ min: 0, max: 1 }),
    weight: fc.integer({ min: 0, max: 4 }),
  }),
  { minLength: 1, maxLength: 80 },
);

describe("rocAuc", () => {
  it("matches Hanley & McNeil's rating example", () => {
    // Source: Hanley & McNeil, Radiology 143:29-36 (1982), Table I: 58 normal and 51
    // abnormal patients on a 5-point rating; AUC = W = 2642 / 2958 = 0.8931711 (check-values.md).
    const normal = [33, 6, 6, 11, 2];
    const abnormal = [3, 2, 2, 11, 33];
    const scores: number[] = [];
    const labels: number[] = [];
    for (let r = 0; r < 5; r++) {
      // rating r + 1 as the score (r + 1) / 5: same order, inside [0, 1]
      for (let k = 0; k < normal[r] + abnormal[r]; k++) {
        scores.push((r + 1) / 5);
        labels.push(k < normal[r] ? 0 : 1);
      }
    }
    expect(scores).toHaveLength(109);
    const auc = rocAuc(Float64Array.from(scores), Uint8Array.from(labels));
    expect(auc).toBeCloseTo(0.8931711, 7);
    expect(auc).toBeCloseTo(2642 / 2958, 14);
  });

  it("equals the Mann-Whitney pair count on random data with ties", () => {
    // Source: the Mann-Whitney U statistic (common practice: AUC = U / (n+ n-), ties 1/2).
    fc.assert(
      fc.property(rows, (data) => {
        const p = Float64Array.from(data, (r) => r.score / 12);
        const y = Uint8Array.from(data, (r) => r.label);
        const expected = mannWhitneyAuc(p, y);
        const auc = rocAuc(p, y);
        if (Number.isNaN(expected)) return Number.isNaN(auc);
        return Math.abs(auc - expected) <= 1e-12;
      }),
      { numRuns: 500 },
    );
  });

  it("with integer weights equals the AUC of the data with rows repeated", () => {
    fc.assert(
      fc.property(
        rows.filter((d) => d.some((r) => r.weight > 0)),
        (data) => {
          const p = Float64Array.from(data, (r) => r.score / 12);
          const y = Uint8Array.from(data, (r) => r.label);
          const w = Float64Array.from(data, (r) => r.weight);
          const repeated = data.flatMap((r) => Array<typeof r>(r.weight).fill(r));
          const expected = rocAuc(
            Float64Array.from(repeated, (r) => r.score / 12),
            Uint8Array.from(repeated, (r) => r.label),
          );
          const auc = rocAuc(p, y, w);
          if (Number.isNaN(expected)) return Number.isNaN(auc);
          // both equal the weighted pair count too
          return (
            Math.abs(auc - expected) <= 1e-12 && Math.abs(auc - mannWhitneyAuc(p, y, w)) <= 1e-12
          );
        },
      ),
      { numRuns: 300 },
    );
  });

  it("is NaN when one class is absent and 0.5 when every score ties", () => {
    expect(rocAuc(Float64Array.of(0.2, 0.4), Uint8Array.of(1, 1))).toBeNaN();
    expect(rocAuc(Float64Array.of(0.3, 0.3, 0.3), Uint8Array.of(1, 0, 0))).toBe(0.5);
  });

  it("agrees with the pair count on a few thousand continuous scores", () => {
    let s = 12345;
    const next = () => (s = (s * 1103515245 + 12345) >>> 0) / 2 ** 32;
    const n = 3000;
    const p = new Float64Array(n);
    const y = new Uint8Array(n);
    for (let i = 0; i < n; i++) {
      y[i] = next() < 0.2 ? 1 : 0;
      p[i] = Math.min(1, Math.max(0, 0.3 * next() + 0.2 * y[i] + (i % 7 === 0 ? 0 : 0.1)));
    }
    expect(rocAuc(p, y)).toBeCloseTo(mannWhitneyAuc(p, y), 12);
  });
});
