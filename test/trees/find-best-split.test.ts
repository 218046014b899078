import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { findBestSplit, type HistogramLayout } from "../../trainer/trees/find-best-split.js";
import { COLUMN_SLOTS, SLOT_VALUES } from "../../trainer/trees/histogram-kernel.js";

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
          }),
          { minLength: 2, maxLength: 7 },
        ),
        fc.boolean(),
        (categories, withMissing) => {
          const k = categories.length;
          // Gradient and hessian sums per bin; every category and the missing bin hold rows.
          const hist = new Float64Array(SLOT_VALUES * COLUMN_SLOTS);
          categories.forEach(({ g, h }, b) => hist.set([g, h], SLOT_VALUES * b));
          if (withMissing) hist.set([3.5, 1.5], SLOT_VALUES * k);
          const layout: HistogramLayout = {
            columnCount: 1,
            valueBins: Int32Array.of(k),
            columnCategorical: Uint8Array.of(1),
          };
          const slots = Array.from({ length: k + 1 }, (_, b) =>
            Array.from(hist.subarray(SLOT_VALUES * b, SLOT_VALUES * b + 2)),
          );
          const [G, H] = slots.reduce((a, s) => [a[0] + s[0], a[1] + s[1]], [0, 0]);
          // Groups count the bins that hold rows: a side without any is no split.
          const C = k + (withMissing ? 1 : 0);
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
                cl += 1;
              }
              if (withMissing && missingLeft) {
                gl += slots[k][0];
                hl += slots[k][1];
                cl += 1;
              }
              if (cl === 0 || cl === C) continue;
              best = Math.max(best, score(gl, hl) + score(G - gl, H - hl) - score(G, H));
            }
          }
          const choice = findBestSplit(hist, layout, null, G, H, rules);
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
