import { describe, expect, it } from "vitest";
import { checkScoringModel } from "../../scorer/check-scoring-model.js";
import { STANDARDIZED_LIMIT, clipStandardized } from "../../scorer/clip-standardized.js";
import { columnsFromItems } from "../../scorer/columns-from-items.js";
import { createScorer } from "../../scorer/create-scorer.js";
import { RowEncoder } from "../../scorer/row-encoder.js";
import { encodedLayout } from "../../scorer/encoded-layout.js";
import { mixedModel } from "./fixtures.js";

// Ground truth by construction: standardized inputs are clipped at a million
// standard deviations, the same in the encoder (training) and the scorer
// (serving), and the loader refuses weights that could still overflow a logit.
describe("standardized numeric inputs", () => {
  it("clips (x - mean) / std at the limit, including past the double range", () => {
    expect(clipStandardized(0.65, 0.4, 0.25)).toBeCloseTo(1, 15);
    expect(clipStandardized(1e308, -1e308, 1)).toBe(STANDARDIZED_LIMIT);
    expect(clipStandardized(-1e308, 1e308, 0.5)).toBe(-STANDARDIZED_LIMIT);
  });

  it("scores hostile items to saturated, finite probabilities", () => {
    const model = mixedModel();
    const heads = model.heads.map((head) => ({
      ...head,
      // Opposite-signed weights on both numerics: unclipped, 1e308 inputs gave Inf - Inf = NaN.
      weight: head.weight.map((w, i) =>
        head.index[i] >= encodedLayout(model.forests, model.encoding).numericOffset
          ? i % 2 === 0
            ? 1e290
            : -1e290
          : w,
      ),
    }));
    const scorer = createScorer({ ...model, heads });
    const result = scorer.scoreOne({ tie_strength: 1e308, post_age_hours: 1e308 });
    for (const p of Object.values(result.probability)) expect(Number.isFinite(p)).toBe(true);
    expect(Number.isFinite(result.combined)).toBe(true);
  });

  it("encodes the clipped value for training, as the scorer serves it", () => {
    const model = mixedModel();
    const encoder = new RowEncoder(model);
    const buffers = encoder.allocate(1);
    const batch = columnsFromItems(
      {
        numeric: model.contract.numeric,
        categorical: model.contract.categorical.map((c) => c.name),
      },
      [{ tie_strength: 1e308, post_age_hours: -1e308 }],
    );
    const encoded = encoder.encode(batch, buffers);
    const values = Array.from(encoded.value!.subarray(encoded.offsets[0], encoded.offsets[1]));
    expect(values.slice(-2)).toEqual([STANDARDIZED_LIMIT, -STANDARDIZED_LIMIT]);
  });

  it("refuses numeric weights whose product with the largest input overflows", () => {
    const model = mixedModel();
    const numericOffset = encodedLayout(model.forests, model.encoding).numericOffset;
    const head = model.heads[0];
    const weight = head.weight.map((w, i) => (head.index[i] === numericOffset ? 1e303 : w));
    const issues = checkScoringModel({
      ...model,
      heads: [{ ...head, weight }, ...model.heads.slice(1)],
    });
    expect(issues.map((issue) => [issue.code, issue.path])).toContainEqual([
      "overflow",
      "/heads/0/weight",
    ]);
    // The same weight on a leaf counts once and loads.
    const leafWeight = head.weight.map((w, i) => (i === 0 ? 1e303 : w));
    expect(
      checkScoringModel({
        ...model,
        heads: [{ ...head, weight: leafWeight }, ...model.heads.slice(1)],
      }),
    ).toEqual([]);
  });
});
