/**
 * A deliberately plain reference for the scorer, written for the tests: recursive
 * traversal of the in-memory trees, the encoded index space built from the
 * layout description in scorer/model-types.ts, hashing by the byte-at-a-time
 * MurmurHash3 port, a dot product over a weight map, sigmoid and the
 * downsampling correction q = p / (p + (1 - p) / rate) (He et al. 2014).
 */
import type { ScoringModel, TreeModel } from "../../scorer/model-types.js";
import type { ScoreItem } from "../../scorer/score-item.js";
import { murmur3Text } from "./murmur3-bytes.js";

function numberOf(item: ScoreItem, name: string): number {
  const value = Object.prototype.hasOwnProperty.call(item, name) ? item[name] : undefined;
  return typeof value === "number" ? value : NaN;
}

function textOf(item: ScoreItem, name: string): string | null {
  const value = Object.prototype.hasOwnProperty.call(item, name) ? item[name] : undefined;
  if (typeof value === "string") return value;
  if (typeof value === "number" && Number.isFinite(value)) return String(value);
  return null;
}

/** The leaf (0 .. 2^depth - 1) a tree sends the item to, by recursion from the root. */
export function referenceLeaf(
  tree: TreeModel,
  depth: number,
  model: Pick<ScoringModel, "contract">,
  item: ScoreItem,
): number {
  const internal = 2 ** depth - 1;
  const walk = (node: number): number => {
    if (node >= internal) return node - internal;
    const f = tree.feature[node];
    if (f === -1) return walk(2 * node + 1);
    const numericCount = model.contract.numeric.length;
    let right: boolean;
    if (f < numericCount) {
      const x = numberOf(item, model.contract.numeric[f]);
      right = Number.isNaN(x) ? tree.missingRight[node] === 1 : x > tree.threshold[node];
    } else {
      const feature = model.contract.categorical[f - numericCount];
      const text = textOf(item, feature.name);
      const code = text === null ? -1 : feature.values.indexOf(text);
      right =
        code === -1
          ? tree.missingRight[node] === 1
          : Array.from(tree.rightCategories[node] ?? []).includes(code);
    }
    return walk(2 * node + 1 + (right ? 1 : 0));
  };
  return walk(0);
}

/** The encoded entries of an item, in the order the layout describes (hashed entries sorted). */
export function referenceEncode(
  model: Omit<ScoringModel, "heads" | "valueWeights">,
  item: ScoreItem,
): { index: number[]; value: number[] } {
  const index: number[] = [];
  const value: number[] = [];
  let offset = 0;
  for (const forest of model.forests) {
    forest.trees.forEach((tree, t) => {
      index.push(offset + t * 2 ** forest.depth + referenceLeaf(tree, forest.depth, model, item));
      value.push(1);
    });
    offset += forest.trees.length * 2 ** forest.depth;
  }
  const { encoding } = model;
  const mask = 2 ** encoding.hashBits - 1;
  const hashed: number[] = [];
  for (const column of encoding.hashed) {
    const text = textOf(item, column);
    if (text !== null)
      hashed.push(offset + (murmur3Text(`${column}=${text}`, encoding.hashSeed) & mask));
  }
  for (const cross of encoding.crosses) {
    const texts = cross.map((column) => textOf(item, column));
    if (texts.every((text) => text !== null)) {
      const key = cross.map((column, k) => `${column}=${texts[k]}`).join("&");
      hashed.push(offset + (murmur3Text(key, encoding.hashSeed) & mask));
    }
  }
  hashed.sort((a, b) => a - b);
  for (const bucket of hashed) {
    index.push(bucket);
    value.push(1);
  }
  offset += 2 ** encoding.hashBits;
  encoding.numeric.forEach((entry, j) => {
    const x = numberOf(item, entry.name);
    if (Number.isFinite(x)) {
      index.push(offset + j);
      value.push((x - entry.mean) / entry.std);
    }
  });
  return { index, value };
}

/** Per head the served probability, and the combined score. */
export function referenceScore(
  model: ScoringModel,
  item: ScoreItem,
): { probability: number[]; combined: number } {
  const { index, value } = referenceEncode(model, item);
  const probability = model.heads.map((head) => {
    const weights = new Map<number, number>();
    head.index.forEach((i, k) => weights.set(i, head.weight[k]));
    let z = head.bias;
    index.forEach((i, k) => {
      z += (weights.get(i) ?? 0) * value[k];
    });
    const p = 1 / (1 + Math.exp(-z));
    const rate = head.negativeKeepRate;
    return p / (p + (1 - p) / rate);
  });
  const combined = probability.reduce((sum, q, h) => sum + model.valueWeights[h] * q, 0);
  return { probability, combined };
}
