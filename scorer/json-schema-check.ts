/**
 * A small JSON Schema (2020-12 subset) checker with no dependencies, so that the
 * scorer can validate artifacts in any browser and the trainer can validate the
 * dataset schema and configuration with the very same code.
 *
 * Supported keywords: type, enum, const, properties, required,
 * additionalProperties, items, minItems, maxItems, uniqueItems, minLength,
 * maxLength, pattern, minimum, maximum, exclusiveMinimum, exclusiveMaximum,
 * anyOf, oneOf, $ref (local "#/$defs/..." only). Unknown keywords are ignored,
 * as the standard says; the test suite checks this subset against ajv on every
 * schema file in `schemas/`. With `exactIntegers`, "integer" means a safe
 * integer (|v| <= 2^53 - 1): a count, size or seed must be exact, and JSON.parse
 * silently rounds 9007199254740993 to ...992 (the standard, and ajv, take 1e300
 * for an integer).
 *
 * @example
 * const issues = checkJsonSchema({ type: "integer", minimum: 1 }, 0);
 * // [{ path: "", code: "minimum", message: "expected a number >= 1, found 0" }]
 */
export interface SchemaIssue {
  /** JSON Pointer-like path of the offending value, e.g. "/columns/3/role". */
  readonly path: string;
  /** The keyword that failed. */
  readonly code: string;
  readonly message: string;
}

export type JsonSchema = { readonly [keyword: string]: unknown } | boolean;

const MAX_DEPTH = 200;
const MAX_ISSUES = 50;

/** How to check; every field is optional. */
export interface SchemaCheckOptions {
  /** Refuse integers beyond +-(2^53 - 1), which a double cannot hold exactly. Default false (the standard's reading). */
  readonly exactIntegers?: boolean;
}

/** The document's root schema (for $ref) and the options, passed down the walk. */
interface Walk {
  readonly schema: JsonSchema;
  readonly exactIntegers: boolean;
}

/** Checks `value` against `schema`; returns every problem found (at most 50), empty when valid. */
export function checkJsonSchema(
  schema: JsonSchema,
  value: unknown,
  options: SchemaCheckOptions = {},
): SchemaIssue[] {
  const issues: SchemaIssue[] = [];
  visit(schema, value, "", { schema, exactIntegers: options.exactIntegers === true }, issues, 0);
  return issues;
}

function visit(
  schema: JsonSchema,
  value: unknown,
  path: string,
  root: Walk,
  issues: SchemaIssue[],
  depth: number,
): void {
  if (issues.length >= MAX_ISSUES) return;
  if (depth > MAX_DEPTH) {
    issues.push({ path, code: "depth", message: `nesting deeper than ${MAX_DEPTH} levels` });
    return;
  }
  if (schema === true) return;
  if (schema === false) {
    issues.push({ path, code: "false", message: "no value is allowed here" });
    return;
  }
  const s = schema;
  const ref = own(s, "$ref");
  if (typeof ref === "string") {
    visit(resolveRef(root.schema, ref), value, path, root, issues, depth + 1);
  }
  const type = own(s, "type");
  if (type !== undefined && !matchesType(type, value, root.exactIntegers)) {
    const expected = Array.isArray(type) ? type.join(" or ") : String(type);
    const inexact =
      root.exactIntegers && Number.isInteger(value) && !Number.isSafeInteger(value)
        ? " (too large to be exact: integers must be within +-(2^53 - 1))"
        : "";
    issues.push({
      path,
      code: "type",
      message: `expected ${expected}, found ${describe(value)}${inexact}`,
    });
    return;
  }
  const enumValues = own(s, "enum");
  if (Array.isArray(enumValues) && !enumValues.some((e) => jsonEqual(e, value))) {
    const list = enumValues.map((e) => JSON.stringify(e)).join(", ");
    issues.push({
      path,
      code: "enum",
      message: `expected one of ${list}, found ${describe(value)}`,
    });
  }
  const constValue = own(s, "const");
  if (constValue !== undefined && !jsonEqual(constValue, value)) {
    issues.push({
      path,
      code: "const",
      message: `expected ${JSON.stringify(constValue)}, found ${describe(value)}`,
    });
  }
  if (typeof value === "number") checkNumber(s, value, path, issues);
  if (typeof value === "string") checkString(s, value, path, issues);
  if (Array.isArray(value)) checkArray(s, value, path, root, issues, depth);
  else if (isObject(value)) checkObject(s, value, path, root, issues, depth);
  checkCombinators(s, value, path, root, issues, depth);
}

function checkNumber(
  s: { readonly [k: string]: unknown },
  value: number,
  path: string,
  issues: SchemaIssue[],
): void {
  const min = own(s, "minimum");
  if (typeof min === "number" && !(value >= min)) {
    issues.push({ path, code: "minimum", message: `expected a number >= ${min}, found ${value}` });
  }
  const max = own(s, "maximum");
  if (typeof max === "number" && !(value <= max)) {
    issues.push({ path, code: "maximum", message: `expected a number <= ${max}, found ${value}` });
  }
  const xmin = own(s, "exclusiveMinimum");
  if (typeof xmin === "number" && !(value > xmin)) {
    issues.push({
      path,
      code: "exclusiveMinimum",
      message: `expected a number > ${xmin}, found ${value}`,
    });
  }
  const xmax = own(s, "exclusiveMaximum");
  if (typeof xmax === "number" && !(value < xmax)) {
    issues.push({
      path,
      code: "exclusiveMaximum",
      message: `expected a number < ${xmax}, found ${value}`,
    });
  }
}

function checkString(
  s: { readonly [k: string]: unknown },
  value: string,
  path: string,
  issues: SchemaIssue[],
): void {
  const minLength = own(s, "minLength");
  const maxLength = own(s, "maxLength");
  if (typeof minLength === "number" || typeof maxLength === "number") {
    const length = codePointLength(value);
    if (typeof minLength === "number" && length < minLength) {
      issues.push({
        path,
        code: "minLength",
        message: `expected at least ${minLength} characters, found ${length}`,
      });
    }
    if (typeof maxLength === "number" && length > maxLength) {
      issues.push({
        path,
        code: "maxLength",
        message: `expected at most ${maxLength} characters, found ${length}`,
      });
    }
  }
  const pattern = own(s, "pattern");
  if (typeof pattern === "string" && !new RegExp(pattern, "u").test(value)) {
    issues.push({
      path,
      code: "pattern",
      message: `expected text matching /${pattern}/, found ${describe(value)}`,
    });
  }
}

function checkArray(
  s: { readonly [k: string]: unknown },
  value: readonly unknown[],
  path: string,
  root: Walk,
  issues: SchemaIssue[],
  depth: number,
): void {
  const minItems = own(s, "minItems");
  if (typeof minItems === "number" && value.length < minItems) {
    issues.push({
      path,
      code: "minItems",
      message: `expected at least ${minItems} items, found ${value.length}`,
    });
  }
  const maxItems = own(s, "maxItems");
  if (typeof maxItems === "number" && value.length > maxItems) {
    issues.push({
      path,
      code: "maxItems",
      message: `expected at most ${maxItems} items, found ${value.length}`,
    });
    return; // do not walk an oversized array item by item
  }
  if (own(s, "uniqueItems") === true) {
    const seen = new Set<string>();
    for (let i = 0; i < value.length; i++) {
      const key = jsonKey(value[i]);
      if (key === null) {
        issues.push({
          path: `${path}/${i}`,
          code: "depth",
          message: `nesting deeper than ${MAX_DEPTH} levels`,
        });
        break;
      }
      if (seen.has(key)) {
        issues.push({
          path: `${path}/${i}`,
          code: "uniqueItems",
          message: `expected unique items, found ${key} twice`,
        });
        break;
      }
      seen.add(key);
    }
  }
  const items = own(s, "items");
  if (items !== undefined && (typeof items === "boolean" || isObject(items))) {
    for (let i = 0; i < value.length && issues.length < MAX_ISSUES; i++) {
      visit(items as JsonSchema, value[i], `${path}/${i}`, root, issues, depth + 1);
    }
  }
}

function checkObject(
  s: { readonly [k: string]: unknown },
  value: { readonly [k: string]: unknown },
  path: string,
  root: Walk,
  issues: SchemaIssue[],
  depth: number,
): void {
  const required = own(s, "required");
  if (Array.isArray(required)) {
    for (const key of required) {
      if (typeof key === "string" && !Object.prototype.hasOwnProperty.call(value, key)) {
        issues.push({
          path: `${path}/${escapePointer(key)}`,
          code: "required",
          message: `required field "${key}" is missing`,
        });
      }
    }
  }
  const properties = own(s, "properties");
  const props = isObject(properties) ? properties : undefined;
  const additional = own(s, "additionalProperties");
  for (const key of Object.keys(value)) {
    const childPath = `${path}/${escapePointer(key)}`;
    const child = value[key];
    const propSchema = props !== undefined ? own(props, key) : undefined;
    if (propSchema !== undefined) {
      visit(propSchema as JsonSchema, child, childPath, root, issues, depth + 1);
    } else if (additional === false) {
      issues.push({
        path: childPath,
        code: "additionalProperties",
        message: `unknown field "${key}"`,
      });
    } else if (isObject(additional)) {
      visit(additional as JsonSchema, child, childPath, root, issues, depth + 1);
    }
    if (issues.length >= MAX_ISSUES) return;
  }
}

function checkCombinators(
  s: { readonly [k: string]: unknown },
  value: unknown,
  path: string,
  root: Walk,
  issues: SchemaIssue[],
  depth: number,
): void {
  const anyOf = own(s, "anyOf");
  const oneOf = own(s, "oneOf");
  for (const [keyword, list] of [
    ["anyOf", anyOf],
    ["oneOf", oneOf],
  ] as const) {
    if (!Array.isArray(list)) continue;
    let passing = 0;
    let firstFailure: SchemaIssue[] = [];
    for (const option of list) {
      const sub: SchemaIssue[] = [];
      visit(option as JsonSchema, value, path, root, sub, depth + 1);
      if (sub.length === 0) passing++;
      else if (firstFailure.length === 0) firstFailure = sub;
    }
    if (passing === 0) {
      const detail =
        firstFailure[0] !== undefined ? ` (first option: ${firstFailure[0].message})` : "";
      issues.push({ path, code: keyword, message: `matches none of the allowed forms${detail}` });
    } else if (keyword === "oneOf" && passing > 1) {
      issues.push({
        path,
        code: keyword,
        message: `matches ${passing} forms where exactly one is allowed`,
      });
    }
  }
}

function resolveRef(root: JsonSchema, ref: string): JsonSchema {
  if (ref === "#") return root;
  if (!ref.startsWith("#/"))
    throw new Error(`json-schema: only local $ref is supported, found "${ref}"`);
  let node: unknown = root;
  for (const part of ref.slice(2).split("/")) {
    const key = part.replace(/~1/g, "/").replace(/~0/g, "~");
    node = isObject(node) ? own(node, key) : undefined;
  }
  if (node === undefined) throw new Error(`json-schema: $ref "${ref}" points nowhere`);
  return node as JsonSchema;
}

function matchesType(type: unknown, value: unknown, exactIntegers: boolean): boolean {
  if (Array.isArray(type)) return type.some((t) => matchesType(t, value, exactIntegers));
  switch (type) {
    case "null":
      return value === null;
    case "boolean":
      return typeof value === "boolean";
    case "string":
      return typeof value === "string";
    case "number":
      return typeof value === "number" && Number.isFinite(value);
    case "integer":
      return (
        typeof value === "number" &&
        (exactIntegers ? Number.isSafeInteger(value) : Number.isInteger(value))
      );
    case "array":
      return Array.isArray(value);
    case "object":
      return isObject(value);
    default:
      return false;
  }
}

function isObject(value: unknown): value is { readonly [k: string]: unknown } {
  return typeof value === "object" && value !== null && !Array.isArray(value);
}

/** Reads an own property only, so keys such as "__proto__" or "constructor" never reach the prototype. */
function own(object: { readonly [k: string]: unknown }, key: string): unknown {
  return Object.prototype.hasOwnProperty.call(object, key) ? object[key] : undefined;
}

function jsonEqual(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (typeof a !== "object" || typeof b !== "object" || a === null || b === null) return false;
  const key = jsonKey(b);
  return key !== null && jsonKey(a) === key;
}

/**
 * JSON text of a parsed value, or null when it nests deeper than MAX_DEPTH:
 * JSON.stringify recurses and throws RangeError on a hostile 100,000-level value.
 */
function jsonKey(value: unknown): string | null {
  return nestedDeeper(value, MAX_DEPTH) ? null : JSON.stringify(value);
}

function nestedDeeper(value: unknown, levels: number): boolean {
  if (typeof value !== "object" || value === null) return false;
  if (levels === 0) return true;
  const children = Array.isArray(value) ? value : Object.values(value);
  for (const child of children) if (nestedDeeper(child, levels - 1)) return true;
  return false;
}

function codePointLength(text: string): number {
  let n = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c < 0xd800 || c > 0xdbff) n++;
  }
  return n;
}

function escapePointer(key: string): string {
  return key.replace(/~/g, "~0").replace(/\//g, "~1");
}

function describe(value: unknown): string {
  if (value === null) return "null";
  if (Array.isArray(value)) return `an array of ${value.length}`;
  if (typeof value === "object") return "an object";
  if (typeof value === "string") {
    const shown = value.length > 40 ? `${value.slice(0, 40)}...` : value;
    return JSON.stringify(shown);
  }
  if (typeof value === "number" && !Number.isFinite(value)) return String(value);
  return `${typeof value} ${String(value)}`;
}
