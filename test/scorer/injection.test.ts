import { existsSync } from "node:fs";
import { afterEach, describe, expect, it } from "vitest";
import type { ScorerArtifact } from "../../scorer/artifact.generated.js";
import { artifactChecksum } from "../../scorer/artifact-checksum.js";
import { columnsFromItems } from "../../scorer/columns-from-items.js";
import { loadScorer } from "../../scorer/load-scorer.js";
import type { ScoringModel } from "../../scorer/model-types.js";
import type { ScoreItem } from "../../scorer/score-item.js";
import { ScorerError } from "../../scorer/scorer-error.js";
import { buildArtifact } from "../../trainer/artifact/build-artifact.js";
import { formatArtifactText } from "../../trainer/artifact/format-artifact-text.js";
import { referenceScore } from "./reference-model.js";

const SHELL = "require('child_process').execSync('touch /tmp/leafcast-pwned')";
const TEMPLATE = "${globalThis.leafcastPwned = 1}";

/** A model whose every name is text that would do harm if anything ran it as code or used it as a property key carelessly. */
const model: ScoringModel = {
  contract: {
    numeric: ["constructor", "__proto__", "process.exit()", "toString"],
    categorical: [
      {
        name: "hasOwnProperty",
        values: ["__proto__", "constructor", "'); process.exit(1); ('", TEMPLATE],
      },
      { name: SHELL, values: [] },
    ],
  },
  forests: [
    {
      outcome: "__proto__",
      baseLogit: -1,
      depth: 2,
      trees: [
        {
          feature: Int32Array.of(1, 4, 0),
          threshold: Float64Array.of(0.5, 0, -1),
          missingRight: Uint8Array.of(1, 0, 0),
          rightCategories: [null, Int32Array.of(0, 3), null],
          leafValue: Float64Array.of(0.1, -0.2, 0.3, -0.4),
        },
      ],
    },
  ],
  encoding: {
    hashBits: 4,
    hashSeed: 7,
    hashed: [SHELL, "hasOwnProperty"],
    crosses: [["hasOwnProperty", SHELL]],
    numeric: [{ name: "__proto__", mean: 0.5, std: 0.25 }],
  },
  heads: ["__proto__", "constructor", "valueOf"].map((outcome, h) => ({
    outcome,
    bias: -0.5 * h,
    index: Int32Array.of(0, 1, 2, 3, 4, 9, 13, 20),
    weight: Float64Array.of(0.4, -0.3, 0.2, 0.1, 0.7, -0.6, 0.5, 0.9 - h),
    negativeKeepRate: h === 1 ? 0.5 : 1,
  })),
  valueWeights: [1, -2, 3],
};

const items: ScoreItem[] = [
  JSON.parse(
    `{"__proto__": 0.9, "constructor": 2, "hasOwnProperty": "__proto__", ${JSON.stringify(SHELL)}: "x; rm -rf /"}`,
  ) as ScoreItem,
  JSON.parse(
    `{"__proto__": 0.1, "toString": 3, "hasOwnProperty": ${JSON.stringify(TEMPLATE)}, ${JSON.stringify(SHELL)}: "\`whoami\`"}`,
  ) as ScoreItem,
  { "process.exit()": 1 },
  {},
];

const scratch = globalThis as { leafcastPwned?: unknown };
const realEval = globalThis.eval;
afterEach(() => {
  globalThis.eval = realEval;
});

describe("an artifact crafted with code-like text cannot run anything", () => {
  it("loads and scores as plain data, equal to the reference, without touching eval or prototypes", () => {
    globalThis.eval = () => {
      throw new Error("eval was called");
    };
    const scorer = loadScorer(
      formatArtifactText(
        buildArtifact({ ...model, valueWeights: { __proto__: 1, constructor: -2, valueOf: 3 } }),
      ),
    );
    items.forEach((item) => {
      const result = scorer.scoreOne(item);
      const reference = referenceScore(model, item);
      expect(Object.getPrototypeOf(result.probability)).toBe(null);
      expect(Object.keys(result.probability)).toEqual(["__proto__", "constructor", "valueOf"]);
      ["__proto__", "constructor", "valueOf"].forEach((outcome, h) => {
        expect(typeof result.probability[outcome]).toBe("number");
        expect(
          Math.abs(result.probability[outcome] - reference.probability[h]),
        ).toBeLessThanOrEqual(1e-12);
      });
      expect(Math.abs(result.combined - reference.combined)).toBeLessThanOrEqual(1e-12);
    });
    const batch = scorer.scoreBatch(columnsFromItems(scorer.features, items));
    expect(Object.getPrototypeOf(batch.probability)).toBe(null);
    expect(batch.probability["__proto__"]).toBeInstanceOf(Float64Array);
    expect(scratch.leafcastPwned).toBeUndefined();
    expect(({} as { polluted?: unknown }).polluted).toBeUndefined();
    expect(Object.getPrototypeOf({})).toBe(Object.prototype);
    expect(existsSync("/tmp/leafcast-pwned")).toBe(false);
  });

  it("reads inherited names only as own properties of an item", () => {
    const scorer = loadScorer(buildArtifact({ ...model, valueWeights: {} }));
    // {} inherits constructor, toString, __proto__ and hasOwnProperty: all must read as missing.
    expect(scorer.scoreOne({}).combined).toBe(scorer.scoreOne({ "process.exit()": null }).combined);
  });

  it("refuses fields the format does not define, and a wrong type where a name belongs", () => {
    const doc = buildArtifact({ ...model, valueWeights: {} }) as ScorerArtifact & {
      onload?: string;
    };
    doc.onload = "process.exit(1)";
    doc.checksum = artifactChecksum(doc);
    expect(() => loadScorer(doc)).toThrow(/unknown field "onload"/);
    const bad = JSON.parse(JSON.stringify(buildArtifact({ ...model, valueWeights: {} }))) as {
      contract: { numeric: unknown[] };
    };
    bad.contract.numeric[0] = { toString: "process.exit(1)" };
    expect(() => loadScorer(bad)).toThrow(ScorerError);
    expect(() => loadScorer(bad)).toThrow(
      /\/contract\/numeric\/0: expected string, found an object/,
    );
  });
});
