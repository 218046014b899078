import { describe, expect, it } from "vitest";
import { recoverySentence } from "../../trainer/report/recovery-sentence.js";
import { recoveryShares } from "../../trainer/report/recovery-shares.js";

// The split follows its definition (frozen - updated) / (frozen - refit); the
// figures are invented ground truth.
describe("recoverySentence", () => {
  it("gives percentages when head updates recover part of the loss", () => {
    const shares = recoveryShares({
      outcome: "react",
      frozenNe: 0.95,
      headsUpdatedNe: 0.91,
      treesRefitNe: 0.9,
    });
    expect(shares).not.toBeNull();
    expect(recoverySentence(shares!)).toMatch(
      /^head updates recover 80\.00 %, 20\.00 % is left to the trees \(NE lost 0\.05/,
    );
  });

  it("says so in words when updated heads beat the refit", () => {
    const shares = recoveryShares({
      outcome: "save",
      frozenNe: 0.95,
      headsUpdatedNe: 0.85,
      treesRefitNe: 0.9,
    });
    expect(shares!.recovered).toBeCloseTo(2, 12);
    expect(recoverySentence(shares!)).toMatch(/^head updates alone beat refitting the trees/);
  });

  it("says so in words when head updates made things worse", () => {
    const shares = recoveryShares({
      outcome: "hide",
      frozenNe: 0.95,
      headsUpdatedNe: 0.97,
      treesRefitNe: 0.9,
    });
    expect(recoverySentence(shares!)).toMatch(/^head updates recover none of it/);
  });
});
