// Property-based hostile-input tests of the training configuration loader:
// random and mutated documents, and damaged files, resolve exactly when ajv
// calls them valid (integers narrowed to exact ones), to the values written or
// the defaults the schema file describes; otherwise they end in a LeafcastError.
// No prototype is ever polluted, and no key reads through to Object.prototype.
import { rmSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import fc from "fast-check";
import { afterAll, afterEach, describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import {
  loadTrainingConfig,
  resolveTrainingConfig,
  type ResolvedTrainingConfig,
} from "../../trainer/schema/load-training-config.js";
import { mutate } from "./byte-mutations.js";
import { fuzzParams } from "./fuzz-params.js";
import {
  applyEdit,
  docEditArb,
  prototypesPolluted,
  schemaWords,
  type Json,
} from "./json-doc-mutations.js";
import { configIsValid, expectedConfig, trainingConfigFile } from "./loader-oracle.js";
import { parseStrictly } from "./oracle-types.js";
import { scratchDir } from "./scratch-dir.js";
import { layoutArb } from "./text-file-cases.js";

const dir = scratchDir("leafcast-hostile-config-");
const path = join(dir, "config.json");
afterAll(() => rmSync(dir, { recursive: true, force: true }));
afterEach(() => expect(prototypesPolluted()).toBeNull());

/** Generated cases per property (the closing note of issue 7 quotes them). */
const RUNS = { random: 3000, mutated: 5000, files: 2000 };

const base: Json = {
  seed: 7,
  workers: 2,
  batchRows: 4096,
  trees: {
    outcomes: ["open", "reply"],
    minForestRate: 0.05,
    count: 50,
    depth: 4,
    learningRate: 0.2,
    bins: 63,
    binSampleRows: 10000,
    l2: 2,
    minLeafHessian: 0.01,
    minSplitGain: 0,
    rowFraction: 0.8,
    featureFraction: 0.9,
    maxCategories: 16,
    validationFraction: 0.2,
    patience: 5,
    sampleRows: 100000,
  },
  heads: {
    outcomes: ["open", "hide"],
    alpha: 0.1,
    beta: 1,
    lambda1: 0.2,
    lambda2: 0.5,
    hashBits: 18,
    hashSeed: 3,
    hashed: ["crop", "post_type"],
    crosses: [["crop", "post_type"]],
    numeric: ["tie_strength"],
    negativeKeepRate: { hide: 0.5 },
    downsampleCorrection: "weight",
    sliceHours: 12,
  },
  checkpoint: { everyTrees: 5, everyRows: 50000 },
};

const words = [...schemaWords(trainingConfigFile as Json), "open", "crop"];

/** Plain data of a resolved configuration (the keep-rate map has no prototype). */
function plain(value: unknown): unknown {
  return JSON.parse(
    JSON.stringify(value, (_k, v: unknown) => (Object.is(v, -0) ? "-0" : v)),
  ) as unknown;
}

function resolveChecked(doc: unknown): ResolvedTrainingConfig | null {
  let resolved: ResolvedTrainingConfig | null = null;
  try {
    resolved = resolveTrainingConfig(doc, "config.json");
  } catch (error) {
    if (!(error instanceof LeafcastError)) throw error;
    expect(error.issues.length).toBeGreaterThan(0);
    expect(error.source).toBe("config");
  }
  expect(resolved !== null).toBe(configIsValid(doc));
  if (resolved !== null) {
    expect(plain(resolved)).toEqual(plain(expectedConfig(doc as Record<string, unknown>)));
    // Outcome names are column names: none may read through to Object.prototype.
    for (const key of ["constructor", "toString", "__proto__", "hasOwnProperty"]) {
      const own = Object.prototype.hasOwnProperty.call(resolved.heads.negativeKeepRate, key);
      if (!own) expect(resolved.heads.negativeKeepRate[key]).toBeUndefined();
    }
  }
  return resolved;
}

const leaf = fc.oneof(
  fc.constantFrom(...words),
  fc.integer({ min: -2, max: 300 }),
  fc.constantFrom(1e308, 2 ** 53 + 2, 2 ** 53 + 1, -0, 0.5, 4294967296),
  fc.boolean(),
  fc.constant(null),
);
const randomDoc = fc.letrec((tie) => ({
  node: fc.oneof(
    { depthSize: "small", withCrossShrink: true },
    leaf,
    fc.array(tie("node"), { maxLength: 4 }),
    fc.dictionary(fc.constantFrom(...words, "__proto__", "constructor", "toString"), tie("node"), {
      maxKeys: 5,
    }),
  ),
})).node as fc.Arbitrary<Json>;

describe("training configuration loader on hostile input", () => {
  it(`resolves exactly the valid ones of ${RUNS.random} random documents`, () => {
    fc.assert(
      fc.property(randomDoc, (doc) => {
        resolveChecked(doc);
      }),
      fuzzParams(RUNS.random),
    );
  });

  it(`resolves exactly the valid ones of ${RUNS.mutated} mutated valid documents`, () => {
    expect(resolveChecked(base)).not.toBeNull();
    expect(resolveChecked({})).not.toBeNull();
    fc.assert(
      fc.property(
        fc.boolean(),
        fc.array(docEditArb(words), { minLength: 1, maxLength: 4 }),
        (empty, edits) => {
          resolveChecked(edits.reduce(applyEdit, empty ? {} : base));
        },
      ),
      fuzzParams(RUNS.mutated),
    );
  });

  it(`loads or refuses ${RUNS.files} damaged files (BOM, invalid UTF-8, cut, NUL)`, async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(docEditArb(words), { maxLength: 2 }),
        layoutArb,
        async (edits, layout) => {
          const text = JSON.stringify(
            edits.reduce(applyEdit, base),
            null,
            layout.trailingNewline ? 2 : 0,
          );
          const bytes = mutate(Buffer.from((layout.bom ? "\ufeff" : "") + text), layout.mutations);
          writeFileSync(path, bytes);
          let loaded: ResolvedTrainingConfig | null = null;
          try {
            loaded = await loadTrainingConfig(path);
          } catch (error) {
            if (!(error instanceof LeafcastError)) throw error;
            expect(error.issues[0].file).toBe(path);
          }
          expect(loaded !== null).toBe(configIsValid(parseStrictly(bytes)));
        },
      ),
      fuzzParams(RUNS.files),
    );
  });
});

describe("training configuration loader on extreme documents", () => {
  function issues(doc: unknown): string[] {
    try {
      resolveTrainingConfig(doc);
      return [];
    } catch (error) {
      if (!(error instanceof LeafcastError)) throw error;
      return error.issues.map((i) => `${i.code}: ${i.message}`);
    }
  }

  it("refuses enormous and inexact declared sizes", () => {
    expect(issues({ trees: { bins: 1e308 } })).toEqual([
      "type: /trees/bins: expected integer, found number 1e+308 (too large to be exact: integers must be within +-(2^53 - 1))",
    ]);
    expect(issues({ trees: { count: 2 ** 53 + 1 } })[0]).toMatch(
      /^type: \/trees\/count: expected integer/,
    );
    // Without a maximum in the schema file, only exactness stops these.
    expect(issues({ trees: { sampleRows: 2 ** 53 + 2 } })[0]).toMatch(/too large to be exact/);
    expect(issues({ checkpoint: { everyRows: 1e300 } })[0]).toMatch(/too large to be exact/);
    expect(issues({ trees: { outcomes: Array.from({ length: 65 }, (_, i) => `o${i}`) } })).toEqual([
      "maxItems: /trees/outcomes: expected at most 64 items, found 65",
    ]);
    // A large but exact count is the caller's business, and a finite float is a float.
    expect(
      resolveTrainingConfig({ trees: { sampleRows: Number.MAX_SAFE_INTEGER, l2: 1e308 } }).trees,
    ).toMatchObject({
      sampleRows: Number.MAX_SAFE_INTEGER,
      l2: 1e308,
    });
  });

  it("refuses 100,000 levels of nesting wherever they sit, including under uniqueItems", async () => {
    const depth = 100_000;
    for (const deep of [
      "[".repeat(depth) + "]".repeat(depth),
      '{"a":'.repeat(depth) + "1" + "}".repeat(depth),
    ]) {
      for (const text of [
        deep,
        `{"trees":{"outcomes":[${deep}]}}`,
        `{"heads":{"hashed":["a",${deep}]}}`,
        `{"heads":{"numeric":[${deep},${deep}]}}`,
        `{"heads":{"crosses":[${deep}]}}`,
        `{"heads":{"negativeKeepRate":{"open":${deep}}}}`,
      ]) {
        writeFileSync(path, text);
        const error = await loadTrainingConfig(path).catch((e: unknown) => e);
        expect(error).toBeInstanceOf(LeafcastError);
      }
    }
  });

  it("keeps outcome names such as constructor and __proto__ as plain keys of the keep rates", () => {
    const config = resolveTrainingConfig(
      JSON.parse('{"heads":{"negativeKeepRate":{"__proto__":0.5,"toString":0.25}}}') as unknown,
    );
    expect(Object.keys(config.heads.negativeKeepRate)).toEqual(["__proto__", "toString"]);
    expect(config.heads.negativeKeepRate["__proto__"]).toBe(0.5);
    expect(config.heads.negativeKeepRate.toString).toBe(0.25);
    // An outcome the file gives no rate has none, even when its name is a prototype key.
    expect(config.heads.negativeKeepRate.constructor).toBeUndefined();
    expect(config.heads.negativeKeepRate.hasOwnProperty).toBeUndefined();
  });

  it("refuses unknown fields named like prototype keys", () => {
    const doc = JSON.parse(
      '{"__proto__":{"polluted":true},"constructor":{"prototype":{"polluted":true}}}',
    ) as unknown;
    expect(issues(doc).map((i) => i.split(":")[0])).toEqual([
      "additionalProperties",
      "additionalProperties",
    ]);
  });

  it("resolves a million distinct hashed column names in bounded time", () => {
    const hashed = Array.from({ length: 1_000_000 }, (_, i) => `c${i}`);
    expect(resolveTrainingConfig({ heads: { hashed } }).heads.hashed).toHaveLength(1_000_000);
    hashed.push("c17");
    expect(issues({ heads: { hashed } })[0]).toMatch(/^uniqueItems:/);
  });
});
