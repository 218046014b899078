import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { findBestSplit, type HistogramLayout } from "../../trainer/trees/find-best-split.js";
import { COLUMN_SLOTS } from "../../trainer/trees/histogram-kernel.js";

// Categorical splits: ordering categories by G / (H + l2) and scanning that order
// finds the best two-way grouping (Fisher 1958 for the squared-error case; the
// same argument covers the gain sum G^2 / (H + l2)). Checked here against a brute
// force over every grouping and both missing directions, on random histograms.
describe("findBestSplit on one categorical column", () => {
  const rules = { l2: 0.7, minLeafHessian: 0, minSplitGain: 0 };

  it("matches brute force over all groupings", () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.record({
            g: fc.double({ min: -20, max: 20, noNaN: true }),
            h: fc.double({ min: 0.01, max: 10, noNaN: true }),
            c: fc.integer({ min: 1, max: 50 }),
          }),
          { minLength: 2, maxLength: 7 },
        ),
        fc.boolean(),
        (categories, withMissing) => {
          const k = categories.length;
          const hist = new Float64Array(3 * COLUMN_SLOTS);
          categories.forEach(({ g, h, c }, b) => hist.set([g, h, c], 3 * b));
          if (withMissing) hist.set([3.5, 1.5, 7], 3 * k);
          const layout: HistogramLayout = {
            columnCount: 1,
            valueBins: Int32Array.of(k),
            columnCategorical: Uint8Array.of(1),
          };
          const slots = Array.from({ length: k + 1 }, (_, b) =>
            Array.from(hist.subarray(3 * b, 3 * b + 3)),
          );
          const [G, H, C] = slots.reduce(
            (a, s) => [a[0] + s[0], a[1] + s[1], a[2] + s[2]],
            [0, 0, 0],
          );
          const score = (g: number, h: number): number => (g * g) / (h + rules.l2);
          let best = 0;
          for (let mask = 1; mask < 2 ** k; mask++) {
            for (const missingLeft of withMissing ? [true, false] : [true]) {
              let gl = 0;
              let hl = 0;
              let cl = 0;
              for (let b = 0; b < k; b++) {
                if ((mask & (1 << b)) === 0) continue;
                gl += slots[b][0];
                hl += slots[b][1];
                cl += slots[b][2];
              }
              if (withMissing && missingLeft) {
                gl += slots[k][0];
                hl += slots[k][1];
                cl += slots[k][2];
              }
              if (cl === 0 || cl === C) continue;
              best = Math.max(best, score(gl, hl) + score(G - gl, H - hl) - score(G, H));
            }
          }
          const choice = findBestSplit(hist, layout, null, G, H, C, rules);
          if (best <= 1e-10 * score(G, H)) {
            expect(choice).toBeNull();
          } else {
            // Tolerance: 1e-9 relative, the sums are taken in different orders.
            expect(choice).not.toBeNull();
            expect(Math.abs((choice?.gain ?? 0) - best)).toBeLessThanOrEqual(
              1e-9 * Math.max(1, best),
            );
          }
        },
      ),
      { numRuns: 300, seed: 42 },
    );
  });
});
