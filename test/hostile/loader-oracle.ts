// The oracle for the schema and configuration loaders: ajv (an independent
// JSON Schema validator from the npm registry) on the schema files in
// schemas/, with "integer" narrowed to exact (safe) integers as Leafcast
// documents, plus the dataset schema's cross-column rules as its file and
// openDataFile's docs state them; and the defaults written in the schema
// files' descriptions ("Default 255."), read from the files.
import { readFileSync } from "node:fs";
import { availableParallelism } from "node:os";
import { Ajv2020 } from "ajv/dist/2020.js";

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

function loadSchema(file: string): { [key: string]: Json } {
  return JSON.parse(readFileSync(`schemas/${file}`, "utf8")) as { [key: string]: Json };
}

/** A copy of a schema where every integer is also bounded to +-(2^53 - 1). */
function exactIntegers(node: Json): Json {
  if (Array.isArray(node)) return node.map(exactIntegers);
  if (node === null || typeof node !== "object") return node;
  const out: { [key: string]: Json } = {};
  for (const [key, value] of Object.entries(node)) out[key] = exactIntegers(value);
  if (out.type === "integer") {
    const max = typeof out.maximum === "number" ? out.maximum : Infinity;
    const min = typeof out.minimum === "number" ? out.minimum : -Infinity;
    out.maximum = Math.min(max, Number.MAX_SAFE_INTEGER);
    out.minimum = Math.max(min, -Number.MAX_SAFE_INTEGER);
  }
  return out;
}

const ajv = new Ajv2020({ strict: false, allErrors: false });
export const datasetSchemaFile = loadSchema("dataset.schema.json");
export const trainingConfigFile = loadSchema("training-config.schema.json");
const validDatasetShape = ajv.compile(exactIntegers(datasetSchemaFile) as object);
const validConfigShape = ajv.compile(exactIntegers(trainingConfigFile) as object);

/** Whether a parsed document is a valid training configuration. */
export function configIsValid(doc: unknown): boolean {
  return validConfigShape(doc);
}

/** Whether a parsed document is a valid dataset schema (shape and cross-column rules). */
export function datasetIsValid(doc: unknown): boolean {
  if (!validDatasetShape(doc)) return false;
  const columns = (doc as { columns: { name: string; role: string; outcome?: string }[] }).columns;
  const names = new Set(columns.map((c) => c.name));
  if (names.size !== columns.length) return false;
  const count = (role: string): number => columns.filter((c) => c.role === role).length;
  if (count("outcome") === 0 || count("weight") > 1 || count("timestamp") > 1) return false;
  return columns.every(
    (c) =>
      c.role !== "true_probability" ||
      columns.some((o) => o.role === "outcome" && c.outcome !== undefined && o.name === c.outcome),
  );
}

/** The default of each configuration field, from its description in the schema file. */
function describedDefault(
  section: string | null,
  field: string,
  doc: Record<string, unknown>,
): unknown {
  const defs = trainingConfigFile.$defs as {
    [k: string]: { properties: { [k: string]: { description?: string } } };
  };
  const props =
    section === null
      ? (trainingConfigFile.properties as (typeof defs)[string]["properties"])
      : defs[section].properties;
  const description = props[field]?.description ?? "";
  if (description.includes("Default: ")) return null;
  const said = /Default ([^ ]+?)\.?(?: \(|$)/.exec(description)?.[1];
  if (said === undefined) return field === "crosses" ? [] : undefined;
  if (said === "none") return [];
  if (said === "2^depth") return 2 ** ((doc.depth as number | undefined) ?? 6);
  if (field === "negativeKeepRate") return {};
  const number = Number(said);
  return Number.isNaN(number) ? said : number;
}

/**
 * The configuration a loader must resolve `doc` to: each field as written, or
 * its described default (workers 0 means one per core).
 */
export function expectedConfig(doc: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const field of ["seed", "workers", "batchRows"]) {
    out[field] = doc[field] ?? describedDefault(null, field, doc);
  }
  if (out.workers === 0) out.workers = Math.max(1, availableParallelism());
  const defs = trainingConfigFile.$defs as {
    [k: string]: { properties: { [k: string]: unknown } };
  };
  for (const section of ["trees", "heads", "checkpoint"]) {
    const given = (doc[section] ?? {}) as Record<string, unknown>;
    const resolved: Record<string, unknown> = {};
    for (const field of Object.keys(defs[section].properties)) {
      resolved[field] = Object.prototype.hasOwnProperty.call(given, field)
        ? given[field]
        : describedDefault(section, field, given);
    }
    out[section] = resolved;
  }
  return out;
}
