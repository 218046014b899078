import { describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import { leafPsi } from "../../trainer/metrics/leaf-psi.js";
import {
  populationStabilityIndex,
  PSI_EPSILON,
} from "../../trainer/metrics/population-stability-index.js";
import { psiReading } from "../../trainer/metrics/psi-reading.js";
import { staleness } from "../../trainer/metrics/staleness.js";

/** The formula of check-values.md, written out: sum (A - E) ln(A / E) over shares. */
function psiByHand(expectedShares: number[], actualShares: number[]): number {
  return expectedShares.reduce(
    (sum, e, i) => sum + (actualShares[i] - e) * Math.log(actualShares[i] / e),
    0,
  );
}

describe("populationStabilityIndex", () => {
  it("matches its formula on a hand case", () => {
    // Source: PSI = sum_i (A_i - E_i) ln(A_i / E_i) (Yurdakul 2018; check-values.md).
    // Expected shares 0.2 / 0.3 / 0.5, actual 0.3 / 0.3 / 0.4:
    // 0.1 ln 1.5 + 0 + (-0.1) ln 0.8 = 0.0405465 + 0.0223144 = 0.0628609
    const psi = populationStabilityIndex(Float64Array.of(20, 30, 50), Float64Array.of(30, 30, 40));
    expect(psi).toBeCloseTo(psiByHand([0.2, 0.3, 0.5], [0.3, 0.3, 0.4]), 14);
    expect(psi).toBeCloseTo(0.0628609, 7);
    // Counts need not share a total: shares are taken per distribution.
    expect(
      populationStabilityIndex(Uint32Array.of(2, 3, 5), Uint32Array.of(300, 300, 400)),
    ).toBeCloseTo(psi, 14);
  });

  it("floors empty-bin shares at epsilon and ignores bins empty in both", () => {
    // Hand case: a bin empty in the new window, with the stated floor 1e-4.
    const psi = populationStabilityIndex(Float64Array.of(50, 50, 0), Float64Array.of(100, 0, 0));
    expect(PSI_EPSILON).toBe(1e-4);
    expect(psi).toBeCloseTo(psiByHand([0.5, 0.5], [1, 1e-4]), 14);
  });

  it("reads values the usual way", () => {
    // Source: thresholds 0.10 and 0.25 (Yurdakul 2018, from credit-scoring practice; check-values.md).
    expect(psiReading(0)).toBe("stable");
    expect(psiReading(0.0999)).toBe("stable");
    expect(psiReading(0.1)).toBe("moderate");
    expect(psiReading(0.25)).toBe("moderate");
    expect(psiReading(0.2501)).toBe("significant");
  });

  it("rejects mismatched or empty distributions with coded issues", () => {
    expect(() => populationStabilityIndex(Float64Array.of(1, 2), Float64Array.of(1))).toThrow(
      /expected 2 bins/,
    );
    expect(() => populationStabilityIndex(Float64Array.of(0, 0), Float64Array.of(1, 1))).toThrow(
      /expected counts expected a positive total/,
    );
    expect(() => populationStabilityIndex(Float64Array.of(1, NaN), Float64Array.of(1, 1))).toThrow(
      LeafcastError,
    );
  });
});

describe("leafPsi", () => {
  it("gives PSI per tree and their mean for the forest", () => {
    // Two trees of four leaves; tree 0 unchanged, tree 1 shifts from (0.4, 0.4, 0.1, 0.1) to (0.1, 0.4, 0.1, 0.4).
    const fit = Float64Array.of(10, 20, 30, 40, 40, 40, 10, 10);
    const later = Float64Array.of(20, 40, 60, 80, 10, 40, 10, 40);
    const psi = leafPsi(fit, later, 4);
    const shifted = psiByHand([0.4, 0.4, 0.1, 0.1], [0.1, 0.4, 0.1, 0.4]);
    expect(psi.perTree[0]).toBeCloseTo(0, 15);
    expect(psi.perTree[1]).toBeCloseTo(shifted, 14);
    expect(psi.forest).toBeCloseTo(shifted / 2, 14);
    expect(psi.max).toBe(psi.perTree[1]);
    expect(psi.maxTree).toBe(1);
  });

  it("names the tree whose counts are unusable", () => {
    const fit = Float64Array.of(1, 1, 0, 0);
    expect(() => leafPsi(fit, Float64Array.of(1, 1, 1, 1), 2)).toThrow(
      /fit-window counts of tree 1 expected a positive total/,
    );
    expect(() => leafPsi(fit, Float64Array.of(1, 1, 1), 2)).toThrow(/expected 4 entries/);
    expect(() => leafPsi(Float64Array.of(1, 1, 1), Float64Array.of(1, 1, 1), 2)).toThrow(
      /multiple of 2/,
    );
  });
});

describe("staleness", () => {
  it("recommends a refit when a forest reaches the threshold, naming it", () => {
    const verdict = staleness({ open: 0.04, reply: 0.31, hide: 0.12 }, 0.25);
    expect(verdict.refit).toBe(true);
    expect(verdict.staleForests).toEqual(["reply"]);
    expect(verdict.worst).toEqual({ forest: "reply", psi: 0.31, reading: "significant" });
    expect(verdict.reason).toBe(
      'refit the trees: forest "reply" has leaf PSI 0.310 (significant shift), at or above the threshold 0.25',
    );
  });

  it("keeps the trees below the threshold and honours a user threshold", () => {
    const psi = { open: 0.04, hide: 0.12 };
    const keep = staleness(psi);
    expect(keep.refit).toBe(false);
    expect(keep.reason).toBe(
      'keep the trees: the largest leaf PSI 0.120 (moderate shift), in forest "hide", is below the threshold 0.25',
    );
    const strict = staleness(psi, 0.1);
    expect(strict.refit).toBe(true);
    expect(strict.staleForests).toEqual(["hide"]);
    expect(staleness({ a: 0.3, b: 0.5 }, 0.1).reason).toContain(
      'forests "b", "a" are at or above the threshold 0.1',
    );
  });

  it("rejects missing or invalid figures", () => {
    expect(() => staleness({})).toThrow(/at least one forest/);
    expect(() => staleness({ open: NaN })).toThrow(/forest "open" PSI expected a finite number/);
    expect(() => staleness({ open: 0.1 }, 0)).toThrow(/threshold expected a positive number/);
  });
});
