import { describe, expect, it } from "vitest";
import { AliasTable } from "../../datasets/plotline/alias-table.js";
import { poissonDraw } from "../../datasets/plotline/poisson-draw.js";
import { RandomSource } from "../../datasets/plotline/random-source.js";

describe("RandomSource", () => {
  it("fills in bulk exactly the draws it gives one by one", () => {
    const bulk = new RandomSource(42, 3);
    const single = new RandomSource(42, 3);
    const out = new Float64Array(1000);
    bulk.fillUnits(out, 1000);
    for (let i = 0; i < 1000; i++) expect(out[i]).toBe(single.unit());
    bulk.fillUnits53(out, 500);
    for (let i = 0; i < 500; i++) {
      const hi = single.uint32() >>> 5;
      const lo = single.uint32() >>> 6;
      expect(out[i]).toBe((hi * 2 ** 26 + lo) / 2 ** 53);
    }
    // Both continue from the same state.
    expect(bulk.uint32()).toBe(single.uint32());
  });

  it("draws uniforms that pass a chi-square test, and streams that differ", () => {
    // 100 equal bins, 200,000 draws: the 99.9 % point of chi-square with 99
    // degrees of freedom is about 148.2 (statistical tables; from memory).
    const rng = new RandomSource(7, 0);
    const out = new Float64Array(200_000);
    rng.fillUnits53(out, out.length);
    const bins = new Float64Array(100);
    let outside = 0;
    for (const u of out) {
      if (u < 0 || u >= 1) outside++;
      else bins[Math.floor(u * 100)]++;
    }
    expect(outside).toBe(0);
    const expected = out.length / 100;
    const chi2 = bins.reduce((s, c) => s + (c - expected) ** 2 / expected, 0);
    expect(chi2).toBeLessThan(148.2);
    expect(new RandomSource(7, 1).uint32()).not.toBe(new RandomSource(7, 0).uint32());
    expect(new RandomSource(8, 0).uint32()).not.toBe(new RandomSource(7, 0).uint32());
  });

  it("gives standard normals (mean 0, variance 1 within sampling error)", () => {
    const rng = new RandomSource(1, 9);
    let sum = 0;
    let sumSq = 0;
    const n = 100_000;
    for (let i = 0; i < n; i++) {
      const z = rng.normal();
      sum += z;
      sumSq += z * z;
    }
    // Standard errors: 1 / sqrt(n) for the mean, sqrt(2 / n) for the variance (common practice).
    expect(Math.abs(sum / n)).toBeLessThan(4 / Math.sqrt(n));
    expect(Math.abs(sumSq / n - 1)).toBeLessThan(4 * Math.sqrt(2 / n));
  });
});

describe("poissonDraw", () => {
  it("inverts the Poisson distribution function", () => {
    // P(X <= 2) for mean 3 is 17 e^-3 / 2 = 0.42319 (the Poisson formula).
    const cdf2 = (17 / 2) * Math.exp(-3);
    expect(poissonDraw(3, Math.exp(-3), cdf2 - 1e-9, 0)).toBe(2);
    expect(poissonDraw(3, NaN, cdf2 + 1e-9, 0)).toBe(3);
    expect(poissonDraw(0, NaN, 0.99, 0)).toBe(0);
  });

  it("matches the mean and variance for small and large means", () => {
    const rng = new RandomSource(3, 3);
    for (const mean of [0.5, 4, 80]) {
      const n = 50_000;
      let sum = 0;
      let sumSq = 0;
      for (let i = 0; i < n; i++) {
        const k = poissonDraw(mean, Math.exp(-mean), rng.unit(), rng.unit());
        sum += k;
        sumSq += k * k;
      }
      const m = sum / n;
      // The mean's standard error is sqrt(mean / n); the variance equals the mean.
      expect(Math.abs(m - mean)).toBeLessThan(4 * Math.sqrt(mean / n));
      expect(sumSq / n - m * m).toBeCloseTo(mean, mean < 10 ? 1 : -1);
    }
  });
});

describe("AliasTable", () => {
  it("draws each index in proportion to its weight, per segment", () => {
    const weights = Float64Array.of(1, 3, 6, 5, 5);
    const table = new AliasTable(weights, Int32Array.of(0, 3, 5));
    const rng = new RandomSource(5, 5);
    const counts = new Float64Array(5);
    const n = 100_000;
    for (let i = 0; i < n; i++) {
      counts[table.draw(0, rng.unit())]++;
      counts[table.draw(1, rng.unit())]++;
    }
    const share = Array.from(counts, (c) => c / n);
    // Binomial standard error at most 0.5 / sqrt(n) = 0.0016; 0.01 is over 6 of them.
    [0.1, 0.3, 0.6, 0.5, 0.5].forEach((p, i) => expect(Math.abs(share[i] - p)).toBeLessThan(0.01));
  });
});
