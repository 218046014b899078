import type { Forest, Head, ScorerArtifact } from "./artifact.generated.js";
import type { ForestModel, HeadModel, ScoringModel, TreeModel } from "./model-types.js";
import { ScorerError, type ScorerIssue } from "./scorer-error.js";

/**
 * Turns a checked artifact (see checkArtifact) into the in-memory model, refusing
 * what the schema cannot express: array lengths that do not match tree count and
 * depth, feature and head indexes out of range, malformed category runs. The
 * remaining semantic checks run in checkScoringModel when the scorer is built.
 * Paths name the offending entry of the artifact.
 *
 * @example
 * const model = modelFromArtifact(checkArtifact(JSON.parse(text)));
 */
export function modelFromArtifact(artifact: ScorerArtifact): ScoringModel {
  const issues: ScorerIssue[] = [];
  const { contract } = artifact;
  const featureCount = contract.numeric.length + contract.categorical.length;
  const forests = artifact.forests.map((forest, f) =>
    forestModel(forest, f, featureCount, contract.numeric.length, issues),
  );
  let width = 0;
  for (const forest of artifact.forests) width += forest.treeCount * 2 ** forest.depth;
  width += 2 ** contract.hashing.bits + contract.standardized.length;
  const heads = artifact.heads.map((head, h) => headModel(head, h, width, issues));
  if (issues.length > 0) throw new ScorerError("artifact", issues.slice(0, 50));
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
    valueWeights: artifact.heads.map((head) => head.valueWeight),
  };
}

function forestModel(
  forest: Forest,
  f: number,
  featureCount: number,
  numericCount: number,
  issues: ScorerIssue[],
): ForestModel {
  const base = `/forests/${f}`;
  const empty: ForestModel = {
    outcome: forest.outcome,
    baseLogit: forest.baseLogit,
    depth: forest.depth,
    trees: [],
  };
  const nodes = 2 ** forest.depth - 1;
  const leaves = nodes + 1;
  const T = forest.treeCount;
  const expect: [keyof Forest & string, number, number][] = [
    ["feature", forest.feature.length, T * nodes],
    ["threshold", forest.threshold.length, T * nodes],
    ["missingRight", forest.missingRight.length, T * nodes],
    ["leafValue", forest.leafValue.length, T * leaves],
  ];
  let ok = true;
  for (const [field, found, expected] of expect) {
    if (found !== expected) {
      ok = false;
      issues.push({
        code: "length",
        path: `${base}/${field}`,
        message: `expected ${expected} entries (${T} trees of depth ${forest.depth}), found ${found}`,
      });
    }
  }
  if (!ok) return empty;
  const bad = forest.feature.findIndex((feature) => feature >= featureCount);
  if (bad >= 0) {
    issues.push({
      code: "out_of_range",
      path: `${base}/feature/${bad}`,
      message: `expected a feature index in [-1, ${featureCount}), found ${forest.feature[bad]}`,
    });
    return empty;
  }
  const feature = Int32Array.from(forest.feature);
  const threshold = Float64Array.from(forest.threshold);
  const missingRight = Uint8Array.from(forest.missingRight);
  const leafValue = Float64Array.from(forest.leafValue);
  const categories = readCategorySplits(
    forest.categorySplits,
    feature,
    numericCount,
    `${base}/categorySplits`,
    issues,
  );
  if (categories === null) return empty;
  const trees: TreeModel[] = [];
  for (let t = 0; t < T; t++) {
    trees.push({
      feature: feature.subarray(t * nodes, (t + 1) * nodes),
      threshold: threshold.subarray(t * nodes, (t + 1) * nodes),
      missingRight: missingRight.subarray(t * nodes, (t + 1) * nodes),
      rightCategories: categories.slice(t * nodes, (t + 1) * nodes),
      leafValue: leafValue.subarray(t * leaves, (t + 1) * leaves),
    });
  }
  return { outcome: forest.outcome, baseLogit: forest.baseLogit, depth: forest.depth, trees };
}

/** The "no run" value of every categorical node: one shared empty array, not one per node (a hostile file may hold millions). */
const NO_CODES = new Int32Array(0);

/** Reads runs of [node, count, code...]; returns per node its right codes (empty for a categorical node without a run), or null after an issue. */
function readCategorySplits(
  runs: readonly number[],
  feature: Int32Array,
  numericCount: number,
  path: string,
  issues: ScorerIssue[],
): (Int32Array | null)[] | null {
  const categories: (Int32Array | null)[] = Array.from(feature, (f) =>
    f >= numericCount ? NO_CODES : null,
  );
  const seen = new Set<number>();
  let at = 0;
  while (at < runs.length) {
    const node = runs[at];
    const count = runs[at + 1];
    if (count === undefined || at + 2 + count > runs.length) {
      issues.push({
        code: "malformed_run",
        path: `${path}/${at}`,
        message: `expected [node, count, ${count ?? "count"} codes], found the array ending after ${runs.length - at} entries`,
      });
      return null;
    }
    if (!(node < feature.length) || feature[node] < numericCount) {
      const what =
        node < feature.length
          ? feature[node] < 0
            ? "a pass-through node"
            : "a numeric node"
          : "no such node";
      issues.push({
        code: "not_categorical",
        path: `${path}/${at}`,
        message: `expected a categorical node entry, found ${node} (${what})`,
      });
      return null;
    }
    if (seen.has(node)) {
      issues.push({
        code: "duplicate",
        path: `${path}/${at}`,
        message: `node ${node} has two runs`,
      });
      return null;
    }
    seen.add(node);
    const codes = runs.slice(at + 2, at + 2 + count);
    const big = codes.findIndex((code) => code > 0x7fffffff);
    if (big >= 0) {
      issues.push({
        code: "out_of_range",
        path: `${path}/${at + 2 + big}`,
        message: `node ${node}: expected a category code, found ${codes[big]}`,
      });
      return null;
    }
    categories[node] = Int32Array.from(codes);
    at += 2 + count;
  }
  return categories;
}

/** Decodes a head's delta-coded indexes, refusing a zero gap (not ascending) or an index past the encoded width. */
function headModel(head: Head, h: number, width: number, issues: ScorerIssue[]): HeadModel {
  const base = `/heads/${h}`;
  const deltas = head.indexDelta;
  const index = new Int32Array(deltas.length);
  if (deltas.length !== head.weight.length) {
    issues.push({
      code: "length",
      path: `${base}/weight`,
      message: `expected one weight per index (${deltas.length}), found ${head.weight.length}`,
    });
  }
  let at = -1;
  for (let i = 0; i < deltas.length; i++) {
    if (i > 0 && deltas[i] < 1) {
      issues.push({
        code: "not_ascending",
        path: `${base}/indexDelta/${i}`,
        message: `expected a gap of at least 1 (indexes strictly ascending), found ${deltas[i]}`,
      });
      break;
    }
    at = i === 0 ? deltas[0] : at + deltas[i];
    if (at >= width) {
      issues.push({
        code: "out_of_range",
        path: `${base}/indexDelta/${i}`,
        message: `expected an encoded index in [0, ${width}), found ${at}`,
      });
      break;
    }
    index[i] = at;
  }
  return {
    outcome: head.outcome,
    bias: head.bias,
    index,
    weight: Float64Array.from(head.weight),
    negativeKeepRate: head.negativeKeepRate,
  };
}
