// Property-based hostile-input tests of the dataset schema loader: random and
// mutated documents, and damaged files, end in a resolved schema exactly when
// ajv (plus the documented cross-column rules) calls the document valid, and
// in a LeafcastError otherwise; no prototype is ever polluted.
import { rmSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import fc from "fast-check";
import { afterAll, afterEach, describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import {
  loadDatasetSchema,
  resolveDatasetSchema,
  type ResolvedSchema,
} from "../../trainer/schema/load-dataset-schema.js";
import { mutate } from "./byte-mutations.js";
import { fuzzParams } from "./fuzz-params.js";
import {
  applyEdit,
  docEditArb,
  prototypesPolluted,
  schemaWords,
  setOwn,
  type Json,
} from "./json-doc-mutations.js";
import { datasetIsValid, datasetSchemaFile } from "./loader-oracle.js";
import { layoutArb } from "./text-file-cases.js";
import { scratchDir } from "./scratch-dir.js";
import { parseStrictly } from "./oracle-types.js";

const dir = scratchDir("leafcast-hostile-schema-");
const path = join(dir, "plots.schema.json");
afterAll(() => rmSync(dir, { recursive: true, force: true }));
afterEach(() => expect(prototypesPolluted()).toBeNull());

/** Generated cases per property (the closing note of issue 7 quotes them). */
const RUNS = { random: 3000, mutated: 5000, files: 2000 };

const base: Json = {
  name: "plotline",
  missing: ["", "NA"],
  columns: [
    { name: "tie_strength", role: "numeric", missing: ["-999"] },
    { name: "crop", role: "categorical", description: "what grows on the plot" },
    { name: "open", role: "outcome" },
    { name: "open_p", role: "true_probability", outcome: "open", required: false },
    { name: "w", role: "weight", allowMissing: false },
    { name: "shown_at", role: "timestamp", timeUnit: "iso" },
    { name: "viewer", role: "group" },
    { name: "note", role: "ignore" },
  ],
};

const words = [...schemaWords(datasetSchemaFile as Json), "tie_strength", "open", "crop"];

/** Resolves, and checks that the outcome is what the oracle says; returns the schema when resolved. */
function resolveChecked(doc: unknown): ResolvedSchema | null {
  let resolved: ResolvedSchema | null = null;
  try {
    resolved = resolveDatasetSchema(doc, "plots.schema.json");
  } catch (error) {
    if (!(error instanceof LeafcastError)) throw error;
    expect(error.issues.length).toBeGreaterThan(0);
    expect(error.issues.every((i) => i.file === "plots.schema.json")).toBe(true);
  }
  expect(resolved !== null).toBe(datasetIsValid(doc));
  if (resolved !== null) expectResolution(doc as DocShape, resolved);
  return resolved;
}

interface DocShape {
  name: string;
  missing?: string[];
  columns: {
    name: string;
    role: string;
    required?: boolean;
    missing?: string[];
    allowMissing?: boolean;
    timeUnit?: string;
    outcome?: string;
  }[];
}

/** Every default as schemas/dataset.schema.json describes it. */
function expectResolution(doc: DocShape, schema: ResolvedSchema): void {
  expect(schema.name).toBe(doc.name);
  expect(schema.columns.map((c) => c.name)).toEqual(doc.columns.map((c) => c.name));
  doc.columns.forEach((spec, i) => {
    const column = schema.columns[i];
    expect(schema.byName.get(spec.name)).toBe(column);
    expect(column.role).toBe(spec.role);
    expect(column.required).toBe(spec.required ?? true);
    expect(column.allowMissing).toBe(
      spec.allowMissing ?? (spec.role === "numeric" || spec.role === "categorical"),
    );
    expect(column.timeUnit).toBe(spec.timeUnit ?? "s");
    expect(column.outcome).toBe(spec.outcome ?? null);
    expect([...column.missing].sort()).toEqual(
      [...new Set(spec.missing ?? doc.missing ?? [""])].sort(),
    );
  });
  const named = (role: string): string[] =>
    doc.columns.filter((c) => c.role === role).map((c) => c.name);
  expect(schema.numeric).toEqual(named("numeric"));
  expect(schema.categorical).toEqual(named("categorical"));
  expect(schema.outcomes).toEqual(named("outcome"));
  expect(schema.groups).toEqual(named("group"));
  expect(schema.weight).toBe(named("weight")[0] ?? null);
  expect(schema.timestamp).toBe(named("timestamp")[0] ?? null);
}

const leaf = fc.oneof(
  fc.constantFrom(...words),
  fc.integer({ min: -2, max: 3 }),
  fc.constantFrom(1e308, 2 ** 53 + 2, -0, 0.5),
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

/** Random documents shaped like a schema: a name, and columns from the schema's own words. */
const shapedDoc = fc
  .record({
    name: leaf,
    columns: fc.array(fc.dictionary(fc.constantFrom(...words, "__proto__"), leaf, { maxKeys: 4 }), {
      maxLength: 5,
    }),
  })
  .map((doc) => doc as Json);

describe("dataset schema loader on hostile input", () => {
  it(`resolves exactly the valid ones of ${RUNS.random} random documents`, () => {
    fc.assert(
      fc.property(fc.oneof(randomDoc, shapedDoc), (doc) => {
        resolveChecked(doc);
      }),
      fuzzParams(RUNS.random),
    );
  });

  it(`resolves exactly the valid ones of ${RUNS.mutated} mutated valid documents`, () => {
    expect(resolveChecked(base)).not.toBeNull();
    fc.assert(
      fc.property(fc.array(docEditArb(words), { minLength: 1, maxLength: 4 }), (edits) => {
        resolveChecked(edits.reduce(applyEdit, base));
      }),
      fuzzParams(RUNS.mutated),
    );
  });

  it(`loads or refuses ${RUNS.files} damaged files (BOM, invalid UTF-8, cut, NUL)`, async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(docEditArb(words), { maxLength: 2 }),
        layoutArb,
        async (edits, layout) => {
          const text = JSON.stringify(edits.reduce(applyEdit, base), null, layout.bom ? 2 : 0);
          const bytes = mutate(Buffer.from((layout.bom ? "\ufeff" : "") + text), layout.mutations);
          writeFileSync(path, bytes);
          let loaded: ResolvedSchema | null = null;
          try {
            loaded = await loadDatasetSchema(path);
          } catch (error) {
            if (!(error instanceof LeafcastError)) throw error;
            expect(error.issues[0].file).toBe(path);
          }
          expect(loaded !== null).toBe(datasetIsValid(parseStrictly(bytes)));
        },
      ),
      fuzzParams(RUNS.files),
    );
  });
});

describe("dataset schema loader on extreme documents", () => {
  async function refusal(text: string | Buffer): Promise<LeafcastError> {
    writeFileSync(path, text);
    const error = await loadDatasetSchema(path).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(LeafcastError);
    return error as LeafcastError;
  }

  it("refuses 100,000 levels of [ or { as a whole file and inside a column", async () => {
    const depth = 100_000;
    const arrays = "[".repeat(depth) + "]".repeat(depth);
    const objects = '{"a":'.repeat(depth) + "1" + "}".repeat(depth);
    for (const deep of [arrays, objects]) {
      await refusal(deep);
      await refusal(`{"name":"p","columns":[${deep}]}`);
      await refusal(`{"name":"p","columns":[{"name":"o","role":"outcome","missing":${deep}}]}`);
      const error = await refusal(
        `{"name":"p","columns":[{"name":"o","role":"outcome","description":${deep}}]}`,
      );
      expect(error.source).toBe("schema");
    }
  });

  it("refuses empty files, a lone BOM and invalid UTF-8, and accepts a leading BOM", async () => {
    for (const text of ["", "\ufeff", "   \n", "\u0000"]) {
      expect((await refusal(text)).code).toBe("invalid_json");
    }
    const latin1 = Buffer.concat([
      Buffer.from('{"name":"p","columns":[{"name":"caf'),
      Buffer.from([0xe9]),
      Buffer.from('","role":"outcome"}]}'),
    ]);
    const error = await refusal(latin1);
    expect(error.issues[0]).toMatchObject({ code: "invalid_utf8", file: path });
    expect(error.message).toContain("0xe9 at byte 35");
    writeFileSync(path, '\ufeff{"name":"p","columns":[{"name":"o","role":"outcome"}]}');
    expect((await loadDatasetSchema(path)).outcomes).toEqual(["o"]);
  });

  it("refuses more columns than maxItems without walking them, and reads prototype-named columns as columns", async () => {
    const many = Array.from({ length: 100_001 }, (_, i) => ({ name: `c${i}`, role: "numeric" }));
    const error = await refusal(JSON.stringify({ name: "p", columns: many }));
    expect(error.issues.map((i) => i.code)).toEqual(["maxItems"]);
    const doc: { [key: string]: Json } = {};
    setOwn(doc, "name", "p");
    setOwn(doc, "columns", [
      { name: "__proto__", role: "outcome" },
      { name: "constructor", role: "numeric" },
      { name: "toString", role: "true_probability", outcome: "__proto__" },
    ]);
    const schema = resolveChecked(doc);
    expect(schema?.outcomes).toEqual(["__proto__"]);
    expect(schema?.trueProbability.get("__proto__")).toBe("toString");
    expect(schema?.byName.get("hasOwnProperty")).toBeUndefined();
  });

  it("refuses a document whose top-level __proto__ key tries to add fields", () => {
    const doc = JSON.parse(
      '{"__proto__":{"polluted":1},"name":"p","columns":[{"name":"o","role":"outcome"}]}',
    ) as unknown;
    expect(() => resolveDatasetSchema(doc)).toThrow(LeafcastError);
  });
});
