import { describe, expect, it } from "vitest";
import { SeededRandom } from "../../trainer/trees/seeded-random.js";

describe("SeededRandom.nextInt", () => {
  it("stays uniform and terminates past 2^32 (a reservoir that has seen more than 2^32 rows)", () => {
    const random = new SeededRandom(7);
    for (const n of [2 ** 32 + 1, 2 ** 40, 2 ** 53 - 1]) {
      let sum = 0;
      const draws = 20_000;
      for (let i = 0; i < draws; i++) {
        const x = random.nextInt(n);
        expect(Number.isInteger(x) && x >= 0 && x < n).toBe(true);
        sum += x / n;
      }
      // Mean of U(0, 1) is 1/2 with standard error sqrt(1/12 / draws) ~ 0.002; allow 5 of them.
      expect(Math.abs(sum / draws - 0.5)).toBeLessThan(0.01);
    }
  });

  it("is deterministic for a seed", () => {
    const a = new SeededRandom(3);
    const b = new SeededRandom(3);
    for (let i = 0; i < 100; i++) expect(a.nextInt(2 ** 45)).toBe(b.nextInt(2 ** 45));
  });
});
