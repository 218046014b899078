import fc from "fast-check";
import type { ScorerArtifact } from "../../scorer/artifact.generated.js";
import type { ScoreItem } from "../../scorer/score-item.js";
import { buildArtifact } from "../../trainer/artifact/build-artifact.js";
import { formatArtifactText } from "../../trainer/artifact/format-artifact-text.js";
import { syntheticItems } from "../../trainer/artifact/synthetic-items.js";
import { syntheticModel } from "../../trainer/artifact/synthetic-model.js";
import { mixedModel } from "../scorer/fixtures.js";
import {
  copyJson,
  hostileValueArb,
  prototypeKeys,
  setOwn,
  type Json,
} from "./json-doc-mutations.js";

type JsonObject = { [key: string]: Json };

const createdAt = new Date("2025-06-02T06:00:00Z");

/**
 * The artifacts the fuzzing starts from (invented Plotline models): a small one
 * (2 forests of 4 trees, depth 3, categorical splits, hashed columns, a cross,
 * standardized numerics; about 8 KB, so thousands of loads stay cheap) and the
 * scorer suite's mixed one (depths 5, 3 and 6, a 40-value categorical read by
 * the bitset kernel; about 100 KB).
 */
export const fuzzArtifacts: { readonly small: ScorerArtifact; readonly mixed: ScorerArtifact } = {
  small: buildArtifact({
    ...syntheticModel({
      trees: 8,
      forests: 2,
      depth: 3,
      categoricalShare: 0.4,
      hashBits: 8,
      hashedPerHead: 20,
      outcomes: ["open", "reply", "hide"],
      seed: 21,
    }),
    valueWeights: { hide: -5 },
    provenance: { name: "plotline-fuzz", createdAt },
  }),
  mixed: buildArtifact({
    ...mixedModel(),
    valueWeights: { open: 1, react: 2.5, hide: -7 },
    provenance: { createdAt },
  }),
};

/** The artifact's text as the trainer writes it. */
export function artifactText(artifact: ScorerArtifact): string {
  return formatArtifactText(artifact);
}

/** Items to score: ordinary synthetic ones plus missing, odd and prototype-named values. */
export const fuzzItems: readonly ScoreItem[] = [
  ...syntheticItems(16, 4),
  {},
  { tie_strength: NaN, soil: "__proto__", crop: "constructor", season: 3 },
  { tie_strength: Infinity, post_age_hours: -Infinity, soil: "soil-33", post_kind: "toString" },
  { tie_strength: 1e300, caption_words: -1e300, season: "winter", crop: "grünkohl 🥬" },
];

/** Every place a value sits in a document: its parent, its key (or index), the value. */
export interface Slot {
  readonly parent: JsonObject | Json[];
  readonly key: string | number;
  readonly value: Json;
}

/** All slots of a document, depth first (the root itself has none). */
export function slotsOf(doc: Json): Slot[] {
  const slots: Slot[] = [];
  const walk = (node: Json): void => {
    if (Array.isArray(node)) {
      node.forEach((value, key) => {
        slots.push({ parent: node, key, value });
        walk(value);
      });
    } else if (node !== null && typeof node === "object") {
      for (const [key, value] of Object.entries(node)) {
        slots.push({ parent: node, key, value });
        walk(value);
      }
    }
  };
  walk(doc);
  return slots;
}

function put(slot: Slot, value: Json): void {
  if (Array.isArray(slot.parent)) slot.parent[slot.key as number] = value;
  else setOwn(slot.parent, slot.key as string, value);
}

/** Numbers that break index, size and sum arithmetic: edges of every range the format has, huge and tiny values, -0. */
export const hostileNumbers: readonly number[] = [
  0,
  -0,
  1,
  -1,
  0.5,
  -0.5,
  2,
  3,
  4,
  5,
  6,
  15,
  16,
  17,
  28,
  29,
  31,
  32,
  33,
  39,
  40,
  64,
  65,
  255,
  256,
  4095,
  65535,
  65536,
  99999,
  100000,
  100001,
  2 ** 31 - 1,
  2 ** 31,
  2 ** 32 - 1,
  2 ** 32,
  2 ** 40,
  2 ** 53,
  2 ** 53 + 2,
  -(2 ** 31),
  1e308,
  -1e308,
  Number.MAX_VALUE,
  -Number.MAX_VALUE,
  5e-324,
  1e-300,
  0.1,
  1 - 2 ** -53,
  1 + 2 ** -52,
];

/** One structural edit of an artifact document. Positions are fractions, so an edit fits any document. */
export type ArtifactEdit =
  | { kind: "number"; at: number; value: number; nudge: boolean }
  | { kind: "field"; name: string; which: number; value: Json }
  | { kind: "retype"; at: number; how: number }
  | { kind: "rename"; at: number; to: string }
  | { kind: "remove"; at: number }
  | { kind: "add"; at: number; key: string; value: Json }
  | { kind: "splice"; at: number; where: number; remove: number; insert: Json[] }
  | { kind: "pair"; head: number; delta: number; weight: number }
  | { kind: "run"; forest: number; node: number; codes: number[]; count: number | null };

const fraction = fc.integer({ min: 0, max: 999_999 }).map((n) => n / 1_000_000);
const hostileNumberArb = fc.oneof(
  fc.constantFrom(...hostileNumbers),
  fc.integer({ min: -3, max: 70 }),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
);
const scalarFields = [
  "treeCount",
  "depth",
  "bits",
  "seed",
  "bias",
  "baseLogit",
  "negativeKeepRate",
  "valueWeight",
  "mean",
  "std",
  "formatVersion",
  "rows",
];
const keyNames = [
  ...prototypeKeys,
  "feature",
  "features",
  "weights",
  "indexDelta",
  "treeCount",
  "depth",
  "categorySplits",
  "Feature",
  "",
  "0",
];

export const artifactEditArb: fc.Arbitrary<ArtifactEdit> = fc.oneof(
  {
    weight: 5,
    arbitrary: fc.record({
      kind: fc.constant("number" as const),
      at: fraction,
      value: hostileNumberArb,
      nudge: fc.boolean(),
    }),
  },
  {
    weight: 3,
    arbitrary: fc.record({
      kind: fc.constant("field" as const),
      name: fc.constantFrom(...scalarFields),
      which: fc.nat({ max: 8 }),
      value: fc.oneof({ weight: 4, arbitrary: hostileNumberArb }, hostileValueArb),
    }),
  },
  {
    weight: 2,
    arbitrary: fc.record({
      kind: fc.constant("retype" as const),
      at: fraction,
      how: fc.nat({ max: 7 }),
    }),
  },
  {
    weight: 1,
    arbitrary: fc.record({
      kind: fc.constant("rename" as const),
      at: fraction,
      to: fc.constantFrom(...keyNames),
    }),
  },
  { weight: 1, arbitrary: fc.record({ kind: fc.constant("remove" as const), at: fraction }) },
  {
    weight: 2,
    arbitrary: fc.record({
      kind: fc.constant("add" as const),
      at: fraction,
      key: fc.constantFrom(...keyNames),
      value: hostileValueArb,
    }),
  },
  {
    weight: 2,
    arbitrary: fc.record({
      kind: fc.constant("splice" as const),
      at: fraction,
      where: fraction,
      remove: fc.nat({ max: 3 }),
      insert: fc.array(fc.oneof(hostileNumberArb, hostileValueArb), { maxLength: 3 }),
    }),
  },
  {
    weight: 2,
    arbitrary: fc.record({
      kind: fc.constant("pair" as const),
      head: fc.nat({ max: 5 }),
      delta: hostileNumberArb,
      weight: hostileNumberArb,
    }),
  },
  {
    weight: 2,
    arbitrary: fc.record({
      kind: fc.constant("run" as const),
      forest: fc.nat({ max: 3 }),
      node: fc.oneof(fc.nat({ max: 40 }), fc.constantFrom(...hostileNumbers)),
      codes: fc.array(fc.oneof(fc.nat({ max: 8 }), fc.constantFrom(...hostileNumbers)), {
        maxLength: 4,
      }),
      count: fc.option(fc.constantFrom(0, 1, 2, 5, 2 ** 31, 2 ** 40), { freq: 4 }),
    }),
  },
);

function pick<T>(list: readonly T[], at: number): T | undefined {
  return list.length === 0 ? undefined : list[Math.floor(at * list.length)];
}

/** Applies edits in turn to a copy of `doc`. */
export function applyArtifactEdits(doc: Json, edits: readonly ArtifactEdit[]): Json {
  const root = copyJson(doc);
  for (const edit of edits) editInPlace(root, edit);
  return root;
}

/** Applies one edit to `root` itself. */
export function editInPlace(root: Json, edit: ArtifactEdit): void {
  const slots = slotsOf(root);
  switch (edit.kind) {
    case "number": {
      const slot = pick(
        slots.filter((s) => typeof s.value === "number"),
        edit.at,
      );
      if (slot !== undefined)
        put(slot, edit.nudge ? (slot.value as number) + Math.sign(edit.value || 1) : edit.value);
      break;
    }
    case "field": {
      const named = slots.filter((s) => s.key === edit.name);
      const slot = named[edit.which % Math.max(1, named.length)];
      if (slot !== undefined) put(slot, edit.value);
      break;
    }
    case "retype": {
      const slot = pick(slots, edit.at);
      if (slot === undefined) break;
      const v = slot.value;
      const forms: Json[] = [
        JSON.stringify(v) ?? "",
        [v],
        { value: v },
        null,
        true,
        typeof v === "number" ? String(v) : 0,
        "NaN",
        "-Infinity",
      ];
      put(slot, forms[edit.how % forms.length]);
      break;
    }
    case "rename": {
      const slot = pick(
        slots.filter((s) => !Array.isArray(s.parent)),
        edit.at,
      );
      if (slot === undefined) break;
      const parent = slot.parent as JsonObject;
      delete parent[slot.key as string];
      setOwn(parent, edit.to, slot.value);
      break;
    }
    case "remove": {
      const slot = pick(slots, edit.at);
      if (slot === undefined) break;
      if (Array.isArray(slot.parent)) slot.parent.splice(slot.key as number, 1);
      else delete slot.parent[slot.key as string];
      break;
    }
    case "add": {
      const objects = [root, ...slots.map((s) => s.value)].filter(
        (v): v is JsonObject => v !== null && typeof v === "object" && !Array.isArray(v),
      );
      const target = pick(objects, edit.at);
      if (target !== undefined) setOwn(target, edit.key, edit.value);
      break;
    }
    case "splice": {
      const arrays = slots.map((s) => s.value).filter((v): v is Json[] => Array.isArray(v));
      const target = pick(arrays, edit.at);
      if (target !== undefined)
        target.splice(Math.floor(edit.where * (target.length + 1)), edit.remove, ...edit.insert);
      break;
    }
    case "pair": {
      const heads = (root as { heads?: Json }).heads;
      const head = Array.isArray(heads) ? heads[edit.head % Math.max(1, heads.length)] : undefined;
      if (head === undefined || head === null || typeof head !== "object" || Array.isArray(head))
        break;
      const { indexDelta, weight } = head;
      if (Array.isArray(indexDelta) && Array.isArray(weight)) {
        indexDelta.push(edit.delta);
        weight.push(edit.weight);
      }
      break;
    }
    case "run": {
      const forests = (root as { forests?: Json }).forests;
      const forest = Array.isArray(forests)
        ? forests[edit.forest % Math.max(1, forests.length)]
        : undefined;
      if (forest === null || typeof forest !== "object" || Array.isArray(forest)) break;
      const runs = forest.categorySplits;
      if (Array.isArray(runs)) runs.push(edit.node, edit.count ?? edit.codes.length, ...edit.codes);
      break;
    }
  }
}

/**
 * Rewrites a document without changing what it says: object keys in a shuffled
 * order and some zeros as -0 (the canonical form writes -0 as 0, so the
 * checksum stays valid).
 */
export function sameMeaning(doc: Json, order: number[], negativeZero: number): Json {
  let draw = 0;
  const next = (): number => order[draw++ % Math.max(1, order.length)] ?? 0;
  const rewrite = (node: Json): Json => {
    if (Array.isArray(node)) return node.map(rewrite);
    if (node === null || typeof node !== "object") {
      return node === 0 && next() % negativeZero === 0 ? -0 : node;
    }
    const keys = Object.keys(node);
    for (let i = keys.length - 1; i > 0; i--) {
      const j = next() % (i + 1);
      [keys[i], keys[j]] = [keys[j], keys[i]];
    }
    const out: JsonObject = {};
    for (const key of keys) setOwn(out, key, rewrite(node[key]));
    return out;
  };
  return rewrite(doc);
}
