// The scorer's own JSON Schema checker is held against ajv, an independent
// validator from the npm registry, on every schema file and on many generated
// documents: both must agree on valid versus invalid.
import { readdirSync, readFileSync } from "node:fs";
import { Ajv2020 } from "ajv/dist/2020.js";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { checkJsonSchema, type JsonSchema } from "../../scorer/json-schema-check.js";

const schemaFiles = readdirSync("schemas").filter((f) => f.endsWith(".schema.json"));

function load(file: string): JsonSchema {
  return JSON.parse(readFileSync(`schemas/${file}`, "utf8")) as JsonSchema;
}

describe("checkJsonSchema", () => {
  it("reports expected versus found", () => {
    expect(checkJsonSchema({ type: "integer", minimum: 1 }, 0)).toEqual([
      { path: "", code: "minimum", message: "expected a number >= 1, found 0" },
    ]);
    const issues = checkJsonSchema(
      { type: "object", properties: { role: { enum: ["a", "b"] } }, additionalProperties: false },
      { role: "c", extra: 1 },
    );
    expect(issues.map((i) => `${i.path} ${i.code}`)).toEqual([
      "/role enum",
      "/extra additionalProperties",
    ]);
  });

  it("never reads a prototype through keys like __proto__ and constructor", () => {
    const schema = { type: "object", required: ["constructor"], properties: {} };
    expect(checkJsonSchema(schema, {})).toHaveLength(1);
    const doc = JSON.parse('{"__proto__": {"polluted": true}, "constructor": 1}') as unknown;
    expect(checkJsonSchema({ type: "object", additionalProperties: false }, doc)).toHaveLength(2);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });

  it("stops at deep nesting instead of overflowing the stack", () => {
    const deep = { type: "array", items: { $ref: "#" } };
    let value: unknown = [];
    for (let i = 0; i < 1000; i++) value = [value];
    const issues = checkJsonSchema(deep, value);
    expect(issues[0]?.code).toBe("depth");
  });

  for (const file of schemaFiles) {
    it(`agrees with ajv on random documents for ${file}`, () => {
      const schema = load(file);
      const ajv = new Ajv2020({ strict: false, allErrors: true });
      const validate = ajv.compile(schema as object);
      // Values built from the schema's own vocabulary hit enums, keys and bounds more often than noise would.
      const words = fc.constantFrom(
        ...new Set(
          JSON.stringify(schema)
            .match(/"[A-Za-z_$][\w$]*"/g)
            ?.map((w) => w.slice(1, -1)),
        ),
      );
      const leaf = fc.oneof(
        words,
        fc.integer({ min: -5, max: 300 }),
        fc.double({ noNaN: true, noDefaultInfinity: true, min: -2, max: 2 }),
        fc.boolean(),
        fc.constant(null),
      );
      const value = fc.letrec((tie) => ({
        node: fc.oneof(
          { depthSize: "small", withCrossShrink: true },
          leaf,
          fc.array(tie("node"), { maxLength: 4 }),
          fc.dictionary(words, tie("node"), { maxKeys: 6 }),
        ),
      })).node;
      fc.assert(
        fc.property(value, (doc) => {
          const ours = checkJsonSchema(schema, doc).length === 0;
          expect(ours).toBe(validate(doc));
        }),
        { numRuns: 2000, seed: 7 },
      );
    });
  }
});
