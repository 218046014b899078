import fc from "fast-check";

export type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

/** Keys that name or reach Object.prototype when code indexes plain objects with them. */
export const prototypeKeys = [
  "__proto__",
  "constructor",
  "prototype",
  "toString",
  "hasOwnProperty",
  "valueOf",
];

/** Sets an own, enumerable property, even for "__proto__" (plain assignment would replace the prototype). */
export function setOwn(target: { [key: string]: Json }, key: string, value: Json): void {
  Object.defineProperty(target, key, {
    value,
    enumerable: true,
    writable: true,
    configurable: true,
  });
}

/** A deep copy that keeps "__proto__" keys as own data (JSON round trip: JSON.parse defines, never assigns). */
export function copyJson<T extends Json>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T;
}

function nested(depth: number, object: boolean): Json {
  return JSON.parse(
    object
      ? '{"a":'.repeat(depth) + "1" + "}".repeat(depth)
      : "[".repeat(depth) + "]".repeat(depth),
  ) as Json;
}

/** Values that break loaders: sizes past every limit, inexact integers, prototype keys, deep nesting. */
export const hostileValueArb: fc.Arbitrary<Json> = fc.oneof(
  fc.constantFrom<Json>(
    0,
    -0,
    1,
    2,
    64,
    255,
    256,
    65536,
    0.5,
    1.5,
    -1,
    1e308,
    -1e308,
    2 ** 31,
    2 ** 32,
    2 ** 53,
    2 ** 53 + 2,
    Number.MAX_VALUE,
    5e-324,
    "",
    "1",
    "open",
    "numeric",
    "__proto__",
    true,
    false,
    null,
    [],
    {},
    ["open"],
    ["open", "open"],
    ["a", "b", "c", "d", "e"],
  ),
  fc.constantFrom(...prototypeKeys).map((key): Json => {
    const inner: { [key: string]: Json } = {};
    setOwn(inner, "polluted", true);
    const outer: { [key: string]: Json } = {};
    setOwn(outer, key, key === "constructor" ? { prototype: inner } : inner);
    return outer;
  }),
  fc.integer({ min: 0, max: 300 }).map((n): Json => Array.from({ length: n }, (_, i) => `c${i}`)),
  fc
    .tuple(fc.integer({ min: 150, max: 400 }), fc.boolean())
    .map(([depth, object]) => nested(depth, object)),
  fc.jsonValue({ maxDepth: 3 }) as fc.Arbitrary<Json>,
);

/** One edit of a document: set a value at a path (existing or new key), or delete a key. */
export interface DocEdit {
  steps: number[];
  key: string;
  value: Json;
  remove: boolean;
}

export function docEditArb(vocabulary: readonly string[]): fc.Arbitrary<DocEdit> {
  return fc.record({
    steps: fc.array(fc.nat(), { maxLength: 4 }),
    key: fc.constantFrom(...vocabulary, ...prototypeKeys),
    value: hostileValueArb,
    remove: fc.boolean(),
  });
}

/**
 * Applies an edit to a copy of `doc`: walks `steps` (each picks a child of an
 * object or array by index, stopping at a leaf), then there sets `key` to
 * `value` (an own property), deletes it, or replaces an array item.
 */
export function applyEdit(doc: Json, edit: DocEdit): Json {
  const root = copyJson(doc);
  let node: Json = root;
  for (const step of edit.steps) {
    const children: Json[] = Array.isArray(node)
      ? node
      : node !== null && typeof node === "object"
        ? Object.values(node)
        : [];
    const next = children[step % Math.max(1, children.length)];
    if (next === undefined || next === null || typeof next !== "object") break;
    node = next;
  }
  if (Array.isArray(node)) {
    if (node.length > 0 && edit.remove) node.splice(edit.steps.length % node.length, 1);
    else node.push(edit.value);
  } else if (node !== null && typeof node === "object") {
    if (edit.remove) delete node[edit.key];
    else setOwn(node, edit.key, edit.value);
  }
  return root;
}

/** Words from a schema file (property names, enum values) to build documents from. */
export function schemaWords(schema: Json): string[] {
  return [
    ...new Set(
      JSON.stringify(schema)
        .match(/"[A-Za-z_$][\w$]*"/g)
        ?.map((w) => w.slice(1, -1)),
    ),
  ];
}

/** What a loader under test added to the built-in prototypes, or null when nothing. */
export function prototypesPolluted(): string | null {
  for (const [name, proto] of [
    ["Object", Object.prototype],
    ["Array", Array.prototype],
    ["Function", Function.prototype],
  ] as const) {
    if (Object.prototype.hasOwnProperty.call(proto, "polluted"))
      return `${name}.prototype.polluted`;
    if (name === "Object" && Object.keys(proto).length > 0)
      return `Object.prototype gained ${Object.keys(proto).join(", ")}`;
  }
  if (({} as Record<string, unknown>).polluted !== undefined) return "({}).polluted";
  return null;
}
