// The oracle for the artifact loader, written from the format's own description
// (schemas/scorer-artifact.schema.json: its keywords and its prose) without the
// scorer's code: ajv (an independent JSON Schema validator from the npm
// registry) for the shape, node:crypto's SHA-256 over an independently written
// canonical form for the checksum, the layout rules the schema's descriptions
// state, and a plain decode of the flat arrays into the test suite's reference
// model (test/scorer/reference-model.ts) for the scores.
import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import { Ajv2020 } from "ajv/dist/2020.js";
import type { ForestModel, HeadModel, ScoringModel, TreeModel } from "../../scorer/model-types.js";
import type { ScoreItem } from "../../scorer/score-item.js";
import { referenceEncode, referenceScore } from "../scorer/reference-model.js";

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };
type Doc = { [key: string]: Json };

const schemaFile = JSON.parse(readFileSync("schemas/scorer-artifact.schema.json", "utf8")) as Doc;

/** A copy of a schema where every integer is also bounded to +-(2^53 - 1), as Leafcast documents. */
function exactIntegers(node: Json): Json {
  if (Array.isArray(node)) return node.map(exactIntegers);
  if (node === null || typeof node !== "object") return node;
  const out: Doc = {};
  for (const [key, value] of Object.entries(node)) out[key] = exactIntegers(value);
  if (out.type === "integer") {
    out.maximum = Math.min(
      typeof out.maximum === "number" ? out.maximum : Infinity,
      Number.MAX_SAFE_INTEGER,
    );
    out.minimum = Math.max(
      typeof out.minimum === "number" ? out.minimum : -Infinity,
      -Number.MAX_SAFE_INTEGER,
    );
  }
  return out;
}

const validShape = new Ajv2020({ strict: false, allErrors: false }).compile(
  exactIntegers(schemaFile) as object,
);

/** The canonical text the schema's checksum description defines, written here from that prose. */
function canonical(value: unknown, top: boolean): string {
  if (Array.isArray(value)) return `[${value.map((v) => canonical(v, false)).join(",")}]`;
  if (value !== null && typeof value === "object") {
    const record = value as Record<string, unknown>;
    const keys = Object.keys(record)
      .filter((key) => !(top && key === "checksum"))
      .sort();
    return `{${keys.map((key) => `${JSON.stringify(key)}:${canonical(record[key], false)}`).join(",")}}`;
  }
  return JSON.stringify(value);
}

/** "sha256:" and the hex digest of the canonical form, by node:crypto. */
export function oracleChecksum(doc: unknown): string {
  return `sha256:${createHash("sha256").update(canonical(doc, true), "utf8").digest("hex")}`;
}

/** The canonical form of a document (checksum left out), to tell whether two documents say the same. */
export function canonicalContent(doc: unknown): string {
  return canonical(doc, true);
}

interface ForestDoc {
  outcome: string;
  baseLogit: number;
  depth: number;
  treeCount: number;
  feature: number[];
  threshold: number[];
  missingRight: number[];
  categorySplits: number[];
  leafValue: number[];
}
interface HeadDoc {
  outcome: string;
  bias: number;
  indexDelta: number[];
  weight: number[];
  negativeKeepRate: number;
  valueWeight: number;
}
interface ArtifactDoc {
  contract: {
    numeric: string[];
    categorical: { name: string; values: string[] }[];
    hashing: { bits: number; seed: number; columns: string[]; crosses: string[][] };
    standardized: { feature: string; mean: number; std: number }[];
  };
  forests: ForestDoc[];
  heads: HeadDoc[];
}

/** Per internal node of a forest, its right codes as the categorySplits runs say, or a reason they are malformed. */
function runsOf(
  forest: ForestDoc,
  numericCount: number,
  valueCounts: number[],
): Map<number, number[]> | string {
  const runs = new Map<number, number[]>();
  const list = forest.categorySplits;
  let at = 0;
  while (at < list.length) {
    const node = list[at];
    const count = list[at + 1];
    if (count === undefined || at + 2 + count > list.length) return `run at ${at} cut short`;
    if (node >= forest.feature.length || forest.feature[node] < numericCount)
      return `run at ${at} names node ${node}, not a categorical node`;
    if (runs.has(node)) return `node ${node} has two runs`;
    const codes = list.slice(at + 2, at + 2 + count);
    const values = valueCounts[forest.feature[node] - numericCount];
    for (let i = 0; i < codes.length; i++) {
      if (codes[i] >= values) return `node ${node}: code ${codes[i]} past ${values} values`;
      if (i > 0 && codes[i] <= codes[i - 1]) return `node ${node}: codes not ascending`;
    }
    runs.set(node, codes);
    at += 2 + count;
  }
  return runs;
}

/**
 * Why a parsed document is not a loadable artifact, or null when it is one: the
 * schema file (exact integers), the checksum, and the rules the schema's prose
 * states (array lengths from tree count and depth, feature and category indexes
 * in range, head indexes strictly ascending inside the encoded width, names
 * unique and resolvable). Plus one rule of the loader's own, stated in
 * scorer/check-scoring-model.ts: no sum the scorer forms may overflow a double,
 * counting a hashed weight once per hashed column and cross and a numeric weight
 * times its largest (clipped) input.
 */
export function artifactProblem(document: unknown): string | null {
  if (!validShape(document)) return `schema: ${JSON.stringify(validShape.errors?.[0] ?? null)}`;
  const doc = document as ArtifactDoc & { checksum: string };
  if (oracleChecksum(doc) !== doc.checksum) return "checksum";
  const { contract } = doc;
  const numericCount = contract.numeric.length;
  const names = [...contract.numeric, ...contract.categorical.map((c) => c.name)];
  if (new Set(names).size !== names.length) return "feature names not unique";
  for (const c of contract.categorical)
    if (new Set(c.values).size !== c.values.length) return `values of ${c.name} not unique`;
  const categoricalNames = new Set(contract.categorical.map((c) => c.name));
  const hashedNames = [...contract.hashing.columns, ...contract.hashing.crosses.flat()];
  if (!hashedNames.every((name) => categoricalNames.has(name)))
    return "hashing names a non-categorical";
  if (!contract.standardized.every((s) => contract.numeric.includes(s.feature)))
    return "standardized names a non-numeric";
  const valueCounts = contract.categorical.map((c) => c.values.length);
  let width = 0;
  for (const forest of doc.forests) {
    const nodes = 2 ** forest.depth - 1;
    const T = forest.treeCount;
    if (
      forest.feature.length !== T * nodes ||
      forest.threshold.length !== T * nodes ||
      forest.missingRight.length !== T * nodes ||
      forest.leafValue.length !== T * (nodes + 1)
    )
      return `forest ${forest.outcome}: lengths`;
    if (forest.feature.some((f) => f >= names.length)) return "feature index out of range";
    const runs = runsOf(forest, numericCount, valueCounts);
    if (typeof runs === "string") return runs;
    let sum = Math.abs(forest.baseLogit);
    for (let t = 0; t < T; t++) {
      let most = 0;
      for (let k = 0; k <= nodes; k++)
        most = Math.max(most, Math.abs(forest.leafValue[t * (nodes + 1) + k]));
      sum += most;
    }
    if (!Number.isFinite(sum)) return "forest values overflow";
    width += T * (nodes + 1);
  }
  const hashedOffset = width;
  width += 2 ** contract.hashing.bits;
  const numericOffset = width;
  width += contract.standardized.length;
  // A hashed bucket can enter a logit once per hashed column and cross; a numeric
  // weight times its input, which the scorer clips at 1e6 standard deviations.
  const hashedTimes = Math.max(
    1,
    contract.hashing.columns.length + contract.hashing.crosses.length,
  );
  const times = (index: number): number =>
    index >= numericOffset ? 1e6 : index >= hashedOffset ? hashedTimes : 1;
  const outcomes = (list: { outcome: string }[]): boolean =>
    new Set(list.map((x) => x.outcome)).size === list.length;
  if (!outcomes(doc.forests) || !outcomes(doc.heads)) return "outcomes not unique";
  let combined = 0;
  for (const head of doc.heads) {
    if (head.indexDelta.length !== head.weight.length) return "head lengths";
    let index = -1;
    for (let i = 0; i < head.indexDelta.length; i++) {
      if (i > 0 && head.indexDelta[i] < 1) return "head indexes not ascending";
      index = i === 0 ? head.indexDelta[0] : index + head.indexDelta[i];
      if (index >= width) return "head index past the encoded width";
    }
    let sum = Math.abs(head.bias);
    let at = -1;
    for (let i = 0; i < head.weight.length; i++) {
      at = i === 0 ? head.indexDelta[0] : at + head.indexDelta[i];
      sum += Math.abs(head.weight[i]) * times(at);
    }
    if (!Number.isFinite(sum)) return "head weights overflow";
    combined += Math.abs(head.valueWeight);
  }
  if (!Number.isFinite(combined)) return "value weights overflow";
  return null;
}

/** The document decoded into the reference model's types, by the schema's layout description. */
export function decodeArtifact(document: unknown): ScoringModel {
  const doc = document as ArtifactDoc;
  const { contract } = doc;
  const numericCount = contract.numeric.length;
  const valueCounts = contract.categorical.map((c) => c.values.length);
  const forests: ForestModel[] = doc.forests.map((forest) => {
    const nodes = 2 ** forest.depth - 1;
    const runs = runsOf(forest, numericCount, valueCounts);
    if (typeof runs === "string") throw new Error(`oracle: ${runs}`);
    const trees: TreeModel[] = [];
    for (let t = 0; t < forest.treeCount; t++) {
      const slice = (list: number[], per: number): number[] => list.slice(t * per, (t + 1) * per);
      trees.push({
        feature: Int32Array.from(slice(forest.feature, nodes)),
        threshold: Float64Array.from(slice(forest.threshold, nodes)),
        missingRight: Uint8Array.from(slice(forest.missingRight, nodes)),
        rightCategories: Array.from({ length: nodes }, (_, n) => {
          const codes = runs.get(t * nodes + n);
          return codes === undefined ? null : Int32Array.from(codes);
        }),
        leafValue: Float64Array.from(slice(forest.leafValue, nodes + 1)),
      });
    }
    return { outcome: forest.outcome, baseLogit: forest.baseLogit, depth: forest.depth, trees };
  });
  const heads: HeadModel[] = doc.heads.map((head) => {
    let index = 0;
    return {
      outcome: head.outcome,
      bias: head.bias,
      index: Int32Array.from(
        head.indexDelta,
        (delta, i) => (index = i === 0 ? delta : index + delta),
      ),
      weight: Float64Array.from(head.weight),
      negativeKeepRate: head.negativeKeepRate,
    };
  });
  return {
    contract: { numeric: contract.numeric, categorical: contract.categorical },
    forests,
    encoding: {
      hashBits: contract.hashing.bits,
      hashSeed: contract.hashing.seed,
      hashed: contract.hashing.columns,
      crosses: contract.hashing.crosses,
      numeric: contract.standardized.map((s) => ({ name: s.feature, mean: s.mean, std: s.std })),
    },
    heads,
    valueWeights: doc.heads.map((head) => head.valueWeight),
  };
}

/**
 * Reference scores of items, with per head a bound on the rounding by which a
 * scorer that adds the same logit terms in another order may differ: at most
 * (terms) x 2^-52 x (sum of the terms' magnitudes) on the logit, a quarter of
 * that on the probability (dq/dz = q (1 - q) <= 1/4, also after the
 * downsampling correction).
 */
export function oracleScores(
  model: ScoringModel,
  items: readonly ScoreItem[],
): { probability: number[]; combined: number; slack: number[] }[] {
  return items.map((item) => {
    const scored = referenceScore(model, item);
    const { index, value } = referenceEncode(model, item);
    const slack = model.heads.map((head) => {
      const weights = new Map<number, number>();
      head.index.forEach((i, k) => weights.set(i, head.weight[k]));
      let magnitude = Math.abs(head.bias);
      index.forEach((i, k) => {
        magnitude += Math.abs((weights.get(i) ?? 0) * value[k]);
      });
      return ((index.length + 1) * magnitude * 2 ** -52) / 4;
    });
    return { ...scored, slack };
  });
}
