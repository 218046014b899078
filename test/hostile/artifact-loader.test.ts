// Property-based hostile-input tests of the scorer's artifact loader (loadScorer,
// which takes the artifact's text or its parsed document). Every case ends in a
// ScorerError, or in a scorer whose scores are finite and agree with an
// independent reading of the same document (test/hostile/artifact-oracle.ts:
// ajv on the schema file, node:crypto for the checksum, the reference model of
// the scorer suite for the scores). Random damage is caught by the checksum, so
// most properties re-seal the checksum after editing, as a careless or hostile
// editor would: that is what reaches the structural checks behind it.
import fc from "fast-check";
import { afterEach, describe, expect, it } from "vitest";
import type { ScorerArtifact } from "../../scorer/artifact.generated.js";
import { artifactChecksum } from "../../scorer/artifact-checksum.js";
import { loadScorer } from "../../scorer/load-scorer.js";
import type { Scorer } from "../../scorer/scorer.js";
import { ScorerError } from "../../scorer/scorer-error.js";
import { mutate, mutationArb } from "./byte-mutations.js";
import {
  applyArtifactEdits,
  artifactEditArb,
  editInPlace,
  artifactText,
  fuzzArtifacts,
  fuzzItems,
  sameMeaning,
} from "./artifact-cases.js";
import {
  artifactProblem,
  canonicalContent,
  decodeArtifact,
  oracleScores,
} from "./artifact-oracle.js";
import { fuzzParams } from "./fuzz-params.js";
import {
  applyEdit,
  copyJson,
  docEditArb,
  prototypesPolluted,
  schemaWords,
  type Json,
} from "./json-doc-mutations.js";

afterEach(() => expect(prototypesPolluted()).toBeNull());

/** Generated cases per property (the closing note of issue 7 quotes them). */
const RUNS = { random: 2000, damagedText: 2000, resealed: 2000, mixed: 150, sameMeaning: 300 };

const small = fuzzArtifacts.small as unknown as Json;
const smallText = artifactText(fuzzArtifacts.small);
const words = [
  ...schemaWords(JSON.parse(JSON.stringify(fuzzArtifacts.small)) as Json),
  "leafcast-scorer",
  "open",
];

/**
 * Loads, returning the scorer or the ScorerError; any other exception fails the
 * test. A load that hangs fails the test by vitest's timeout (nothing here is timed).
 */
function load(input: unknown): Scorer | ScorerError {
  try {
    return loadScorer(input);
  } catch (error) {
    if (!(error instanceof ScorerError)) throw error;
    expect(error.issues.length).toBeGreaterThan(0);
    expect(error.source).toBe("artifact");
    return error;
  }
}

function expectRefused(input: unknown): ScorerError {
  const result = load(input);
  if (!(result instanceof ScorerError)) throw new Error("expected a refusal, but it loaded");
  return result;
}

/** Scores of every fuzz item: per head probabilities (in head order) and the combined score. */
function scoresOf(scorer: Scorer): number[][] {
  return fuzzItems.map((item) => {
    const result = scorer.scoreOne(item);
    return [...scorer.outcomes.map((o) => result.probability[o]), result.combined];
  });
}

const originalScores = scoresOf(loadScorer(smallText));

/**
 * A loaded scorer must score every item finitely and as the oracle reads the
 * same document: within the parity bound of the scorer suite (1e-12) plus the
 * rounding that another order of adding the logit's terms may bring.
 */
function expectOracleScores(scorer: Scorer, doc: unknown): void {
  const model = decodeArtifact(doc);
  expect(scorer.outcomes).toEqual(model.heads.map((h) => h.outcome));
  const expected = oracleScores(model, fuzzItems);
  // The batch path (column binding, chunked kernels) must agree with the one-item path.
  const batch = scorer.scoreItems(fuzzItems);
  fuzzItems.forEach((item, i) => {
    const got = scorer.scoreOne(item);
    // Within the scorer suite's parity bound, 1e-12 (relative for the combined score).
    const near = (a: number, b: number): boolean =>
      Math.abs(a - b) <= 1e-12 * Math.max(1, Math.abs(b));
    expect(near(batch.combined[i], got.combined)).toBe(true);
    for (const outcome of scorer.outcomes)
      expect(near(batch.probability[outcome][i], got.probability[outcome])).toBe(true);
    let combinedSlack = 1e-12 * Math.max(1, Math.abs(expected[i].combined));
    model.heads.forEach((head, h) => {
      const q = got.probability[head.outcome];
      expect(Number.isFinite(q) && q >= 0 && q <= 1).toBe(true);
      const slack = 1e-12 + expected[i].slack[h];
      expect(Math.abs(q - expected[i].probability[h])).toBeLessThanOrEqual(slack);
      combinedSlack += Math.abs(model.valueWeights[h]) * slack;
    });
    expect(Number.isFinite(got.combined)).toBe(true);
    expect(Math.abs(got.combined - expected[i].combined)).toBeLessThanOrEqual(combinedSlack);
  });
}

/** Re-seals the checksum where the document allows it (a document too deep or odd keeps its old one). */
function reseal(doc: Json): Json {
  if (doc !== null && typeof doc === "object" && !Array.isArray(doc)) {
    try {
      doc.checksum = artifactChecksum(doc);
    } catch {
      // canonicalJson refuses nesting past 200 levels: the schema check refuses such a document first.
    }
  }
  return doc;
}

/** The loader's verdict must be the oracle's; a loaded document must score as the oracle says. */
function expectOracleVerdict(doc: Json, asText: boolean): void {
  const result = load(asText ? JSON.stringify(doc) : doc);
  const problem = artifactProblem(asText ? JSON.parse(JSON.stringify(doc)) : doc);
  if (result instanceof ScorerError) {
    expect(
      problem,
      `refused (${result.message.split("\n")[0]}) a document the oracle accepts`,
    ).not.toBeNull();
  } else {
    expect(problem, "loaded a document the oracle refuses").toBeNull();
    expectOracleScores(result, doc);
  }
}

const randomDoc = fc.letrec((tie) => ({
  node: fc.oneof(
    { depthSize: "small", withCrossShrink: true },
    fc.oneof(
      fc.constantFrom(...words),
      fc.integer({ min: -2, max: 300 }),
      fc.constantFrom(1e308, 2 ** 53 + 2, -0, 0.5, 2 ** 40),
      fc.boolean(),
      fc.constant(null),
    ),
    fc.array(tie("node"), { maxLength: 4 }),
    fc.dictionary(fc.constantFrom(...words, "__proto__", "constructor"), tie("node"), {
      maxKeys: 6,
    }),
  ),
})).node as fc.Arbitrary<Json>;

describe("artifact loader on hostile input", () => {
  it("loads the fuzzing fixtures, and the oracle agrees with the scorer on them", () => {
    for (const artifact of [fuzzArtifacts.small, fuzzArtifacts.mixed]) {
      const doc = JSON.parse(artifactText(artifact)) as Json;
      expect(artifactProblem(doc)).toBeNull();
      expectOracleVerdict(doc, true);
    }
  });

  it(`refuses ${RUNS.random} random documents, as text and parsed`, () => {
    fc.assert(
      fc.property(
        fc.oneof(
          randomDoc,
          fc.jsonValue() as fc.Arbitrary<Json>,
          // Artifact-shaped: the right format and version, random everything else.
          fc
            .dictionary(fc.constantFrom(...words), randomDoc, { maxKeys: 8 })
            .map((d): Json => ({ format: "leafcast-scorer", formatVersion: 1, ...d })),
        ),
        (doc) => {
          expectRefused(doc);
          expectRefused(JSON.stringify(doc));
        },
      ),
      fuzzParams(RUNS.random),
    );
  });

  it(`refuses or loads unchanged ${RUNS.damagedText} damaged texts (bytes flipped, cut, invalid UTF-8)`, () => {
    const bytes = new TextEncoder().encode(smallText);
    const content = canonicalContent(JSON.parse(smallText));
    fc.assert(
      fc.property(fc.array(mutationArb, { minLength: 1, maxLength: 3 }), (mutations) => {
        // A caller decodes the file's bytes (TextDecoder puts U+FFFD for invalid UTF-8).
        const text = new TextDecoder().decode(mutate(bytes, mutations));
        const result = load(text);
        if (result instanceof ScorerError) return;
        // Only damage that leaves the content as it was may load (whitespace, a cut newline).
        expect(canonicalContent(JSON.parse(text))).toBe(content);
        expect(scoresOf(result)).toEqual(originalScores);
      }),
      fuzzParams(RUNS.damagedText),
    );
  });

  it(`refuses exactly what the oracle refuses among ${RUNS.resealed} edited, re-sealed artifacts`, () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.oneof(
            { weight: 4, arbitrary: artifactEditArb },
            {
              weight: 1,
              arbitrary: docEditArb(words).map((edit) => ({ kind: "doc" as const, edit })),
            },
          ),
          { minLength: 1, maxLength: 3 },
        ),
        fc.boolean(),
        (edits, asText) => {
          let doc = copyJson(small);
          for (const edit of edits) {
            if (edit.kind === "doc") doc = applyEdit(doc, edit.edit);
            else editInPlace(doc, edit);
          }
          expectOracleVerdict(reseal(doc), asText);
        },
      ),
      fuzzParams(RUNS.resealed),
    );
  });

  it(`refuses exactly what the oracle refuses among ${RUNS.mixed} edited, re-sealed mixed-kernel artifacts`, () => {
    const mixed = JSON.parse(artifactText(fuzzArtifacts.mixed)) as Json;
    fc.assert(
      fc.property(fc.array(artifactEditArb, { minLength: 1, maxLength: 2 }), (edits) => {
        expectOracleVerdict(reseal(applyArtifactEdits(mixed, edits)), false);
      }),
      fuzzParams(RUNS.mixed),
    );
  });

  it(`scores ${RUNS.sameMeaning} rewritings of the same artifact (key order, -0) exactly as the original`, () => {
    fc.assert(
      fc.property(
        fc.array(fc.nat({ max: 1000 }), { minLength: 1, maxLength: 50 }),
        fc.integer({ min: 1, max: 4 }),
        (order, negativeZero) => {
          const doc = sameMeaning(small, order, negativeZero);
          for (const input of [doc, JSON.stringify(doc, null, order[0] % 3)]) {
            const result = load(input);
            if (result instanceof ScorerError) throw result;
            expect(scoresOf(result)).toEqual(originalScores);
          }
        },
      ),
      fuzzParams(RUNS.sameMeaning),
    );
  });
});

describe("artifact loader on extreme documents", () => {
  const doc = (): ScorerArtifact => JSON.parse(smallText) as ScorerArtifact;
  const sealed = (damage: (d: ScorerArtifact) => void): ScorerArtifact => {
    const d = doc();
    damage(d);
    d.checksum = artifactChecksum(d);
    return d;
  };

  it("refuses 100,000 levels of nesting wherever they sit, as text and parsed", () => {
    const depth = 100_000;
    for (const deep of [
      "[".repeat(depth) + "]".repeat(depth),
      '{"a":'.repeat(depth) + "1" + "}".repeat(depth),
    ]) {
      /** The text with `value` put first in the array or object that opens at `at`. */
      const first = (at: string, value: string): string => {
        const end = smallText.indexOf(at) + at.length;
        const empty = /^\s*[}\]]/.test(smallText.slice(end));
        return smallText.slice(0, end) + value + (empty ? "" : ",") + smallText.slice(end);
      };
      const texts = [
        deep,
        smallText.replace('"format": "leafcast-scorer"', `"format": ${deep}`),
        `{"format":"leafcast-scorer","formatVersion":${deep}}`,
        smallText.replace(/"checksum": "[^"]*"/, `"checksum": ${deep}`),
        first('"forests": [', deep),
        first('"weight": [', deep),
        first('"metrics": {', `"open": ${deep}`),
        first('"contract": {', `"__proto__": ${deep}`),
        first('"categorySplits": [', deep),
      ];
      for (const text of texts) {
        expect(text).not.toBe(smallText);
        expectRefused(text);
        expectRefused(JSON.parse(text));
      }
    }
  });

  it("refuses values no JSON text holds, when handed a document, without throwing anything else", () => {
    const values: unknown[] = [
      undefined,
      10n,
      Symbol("artifact"),
      () => smallText,
      new Date(0),
      new Map([["format", "leafcast-scorer"]]),
      // Bytes are not text: a caller decodes the file first (see the damaged-text property).
      new TextEncoder().encode(smallText),
      { format: 10n },
      { format: "leafcast-scorer", formatVersion: Symbol("1") },
      { format: "leafcast-scorer", formatVersion: 1n },
      { ...doc(), checksum: 1n },
      { ...doc(), heads: [{ ...doc().heads[0], bias: 2n }] },
      { ...doc(), heads: [{ ...doc().heads[0], bias: NaN }] },
      { ...doc(), heads: [{ ...doc().heads[0], weight: [Infinity] }] },
    ];
    for (const value of values) expectRefused(value);
  });

  it("loads a prototype-less copy of a valid document and scores it the same", () => {
    const bare = JSON.parse(smallText, function (this: unknown, _key, value: unknown) {
      return value !== null && typeof value === "object" && !Array.isArray(value)
        ? Object.assign(Object.create(null) as object, value)
        : value;
    }) as unknown;
    expect(Object.getPrototypeOf(bare)).toBeNull();
    const scorer = load(bare);
    if (scorer instanceof ScorerError) throw scorer;
    expect(scoresOf(scorer)).toEqual(originalScores);
  });

  it("refuses enormous declared sizes behind a valid checksum", () => {
    const cases: [string, (d: ScorerArtifact) => void][] = [
      ["treeCount 2^40", (d) => (d.forests[0].treeCount = 2 ** 40)],
      ["treeCount at the schema's maximum", (d) => (d.forests[0].treeCount = 100_000)],
      ["depth 2^40", (d) => (d.forests[0].depth = 2 ** 40)],
      ["depth 16 with the arrays of depth 3", (d) => (d.forests[0].depth = 16)],
      ["2^40 hash bits", (d) => (d.contract.hashing.bits = 2 ** 40)],
      ["a category run of 2^40 codes", (d) => d.forests[0].categorySplits.push(0, 2 ** 40, 1)],
      ["a head index at 2^40", (d) => d.heads[0].indexDelta.push(2 ** 40)],
      ["a head index gap of 1e308", (d) => (d.heads[0].indexDelta[1] = 1e308)],
      ["2^53 + 2 as a feature index", (d) => (d.forests[1].feature[0] = 2 ** 53 + 2)],
      [
        "more weights than indexes",
        (d) => d.heads[1].weight.push(...new Array<number>(10_000).fill(1)),
      ],
    ];
    for (const [name, damage] of cases) {
      const error = expectRefused(sealed(damage));
      expect(error.message, name).toMatch(/^artifact: /);
    }
  });

  it("refuses weights whose sums overflow a double, instead of scoring NaN or Infinity", () => {
    let error = expectRefused(
      sealed((d) => {
        d.heads[0].valueWeight = 1e308;
        d.heads[1].valueWeight = 1e308;
      }),
    );
    expect(error.code).toBe("overflow");
    expect(error.path).toBe("/heads");
    error = expectRefused(
      sealed((d) => {
        d.heads[2].weight = d.heads[2].weight.map((_, i) => (i % 2 === 0 ? 1e308 : -1e308));
      }),
    );
    expect(error.code).toBe("overflow");
    expect(error.path).toBe("/heads/2/weight");
    error = expectRefused(
      sealed((d) => (d.forests[1].leafValue = d.forests[1].leafValue.map(() => -1e308))),
    );
    expect(error.code).toBe("overflow");
    expect(error.path).toBe("/forests/1/leafValue");
    // One huge value alone is legal: every sum it enters stays finite.
    const one = load(sealed((d) => (d.heads[0].weight[3] = 1e308)));
    expect(one).not.toBeInstanceOf(ScorerError);
  });

  it("refuses a small file that would need gigabytes of split tables", () => {
    // A 65,536-value categorical feature and 100,000 nodes splitting on it: about
    // 1 MB of text, but the bitset kernel would need 400 million words (1.6 GB).
    const damaged = sealed((d) => {
      const features = d.contract.numeric.length;
      d.contract.categorical[0].values = Array.from({ length: 65_536 }, (_, k) => `v${k}`);
      const depth = 10;
      const trees = 100;
      const nodes = trees * (2 ** depth - 1);
      d.forests = [
        {
          outcome: "open",
          baseLogit: 0,
          depth,
          treeCount: trees,
          feature: new Array<number>(nodes).fill(features),
          threshold: new Array<number>(nodes).fill(0),
          missingRight: new Array<number>(nodes).fill(1),
          categorySplits: [],
          leafValue: new Array<number>(trees * 2 ** depth).fill(0),
        },
      ];
      for (const head of d.heads) {
        head.indexDelta = [0];
        head.weight = [0.5];
      }
    });
    const error = expectRefused(damaged);
    expect(error.code).toBe("too_large");
    expect(error.path).toBe("/forests/0");
    expect(error.message).toMatch(
      /expected compiled tables of at most 1024 MiB, found a model needing 15\d\d MiB/,
    );
  });

  it("keeps prototype keys at every level as plain data, refused as unknown fields", () => {
    const text = JSON.stringify(copyJson(small));
    for (const key of ["__proto__", "constructor", "prototype", "toString"]) {
      for (const at of [
        '"contract":{',
        '"hashing":{',
        '"provenance":{',
        '"heads":[{',
        '"forests":[{',
      ]) {
        const edited = text.replace(at, `${at}"${key}":{"polluted":true},`);
        expect(edited).not.toBe(text);
        const error = expectRefused(reseal(JSON.parse(edited) as Json));
        expect(error.code).toBe("additionalProperties");
      }
    }
  });
});
