import { describe, expect, it } from "vitest";
import { expectedCalibrationError } from "../../trainer/metrics/expected-calibration-error.js";
import { reliabilityBinIndex } from "../../trainer/metrics/reliability-bin-index.js";
import { reliabilityBins } from "../../trainer/metrics/reliability-bins.js";

// The worked example of check-values.md (Pavlovic 2023, "Expected Calibration Error (ECE):
// a step-by-step visual explanation"): three equal-width bins (lo, hi], binned on p itself.
const p = Float64Array.from([0.22, 0.64, 0.92, 0.42, 0.51, 0.15, 0.7, 0.37, 0.83]);
const y = Uint8Array.from([0, 1, 0, 0, 0, 1, 1, 0, 1]);

describe("expectedCalibrationError", () => {
  it("reproduces the published worked example when its accuracy column is used as the label", () => {
    // The published 0.23778 compares each bin's mean p with the accuracy of the hard
    // prediction (p > 0.5) == y, not with the observed positive rate. Feeding that
    // accuracy column in as the label reproduces it, which checks the bins and weighting.
    const correct = y.map((label, i) => ((p[i] > 0.5 ? 1 : 0) === label ? 1 : 0));
    expect(expectedCalibrationError(p, correct, 3)).toBeCloseTo(0.23778, 5);
  });

  it("compares mean p with the observed positive rate on the same example", () => {
    // Hand computation, bins (0, 1/3], (1/3, 2/3], (2/3, 1]:
    // {0.22, 0.15}: |0.185 - 1/2|; {0.64, 0.42, 0.51, 0.37}: |0.485 - 1/4|; {0.92, 0.70, 0.83}: |0.81667 - 2/3|
    // ECE = (2 * 0.315 + 4 * 0.235 + 3 * 0.15) / 9 = 2.02 / 9
    expect(expectedCalibrationError(p, y, 3)).toBeCloseTo(2.02 / 9, 12);
  });

  it("weights bins by row weight", () => {
    // Hand computation: weight 3 on the first row moves bin 1's mean and share.
    const w = Float64Array.from([3, 1, 1, 1, 1, 1, 1, 1, 1]);
    const bin0 = Math.abs((3 * 0.22 + 0.15) / 4 - 1 / 4) * 4;
    expect(expectedCalibrationError(p, y, 3, w)).toBeCloseTo((bin0 + 0.94 + 0.45) / 11, 12);
  });
});

describe("reliabilityBins", () => {
  it("puts a p on an edge in the bin below it and p = 0 in the first bin", () => {
    // Convention stated in the issue: bins (lo, hi], p = 0 in the first bin.
    expect(reliabilityBinIndex(0, 10)).toBe(0);
    expect(reliabilityBinIndex(0.1, 10)).toBe(0);
    expect(reliabilityBinIndex(0.1000001, 10)).toBe(1);
    expect(reliabilityBinIndex(1, 10)).toBe(9);
    for (let b = 1; b <= 50; b++) {
      for (let k = 1; k <= b; k++) expect(reliabilityBinIndex(k / b, b)).toBe(k - 1);
    }
    expect(reliabilityBinIndex(0.3, 3)).toBe(0);
    expect(reliabilityBinIndex(0.7, 10)).toBe(6);
  });

  it("reports count, weight, mean prediction and observed rate per bin", () => {
    const bins = reliabilityBins(p, y, 3);
    expect(Array.from(bins.count)).toEqual([2, 4, 3]);
    expect(bins.meanPredicted[1]).toBeCloseTo(0.485, 14);
    expect(Array.from(bins.observedRate)).toEqual([0.5, 0.25, 2 / 3]);
    const sparse = reliabilityBins(Float64Array.of(0.05), Uint8Array.of(1), 4);
    expect(Number.isNaN(sparse.meanPredicted[3])).toBe(true);
    expect(() => reliabilityBins(p, y, 0)).toThrow(/bin count/);
  });
});
