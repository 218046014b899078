import type {
  EncodingSpec,
  FeatureContract,
  ForestModel,
  HeadModel,
  TreeModel,
} from "../../scorer/model-types.js";
import { gaussian, seededRandom } from "./synthetic-random.js";

/** The shape of a generated model. */
export interface SyntheticModelOptions {
  /** Trees in all (split evenly over `forests`). Default 100. */
  readonly trees?: number;
  readonly depth?: number;
  readonly forests?: number;
  /** Outcomes with a head. Default the six Plotline outcomes. */
  readonly outcomes?: readonly string[];
  readonly hashBits?: number;
  /** Share of a head's reachable leaf slots with a non-zero weight. Default 0.5. */
  readonly leafDensity?: number;
  /** Non-zero hashed weights per head. Default 400. */
  readonly hashedPerHead?: number;
  /** Share of split nodes on a categorical feature. Default 0.1. */
  readonly categoricalShare?: number;
  /** Chance that a node stops growing (becomes a pass-through with its subtree). Default 0.04. */
  readonly stopShare?: number;
  readonly seed?: number;
}

/** A generated model in the trainer's in-memory types. */
export interface SyntheticModel {
  readonly contract: FeatureContract;
  readonly forests: ForestModel[];
  readonly encoding: EncodingSpec;
  readonly heads: HeadModel[];
  readonly valueWeights: Record<string, number>;
}

/** The numeric features of the generated Plotline models (invented). */
export const SYNTHETIC_NUMERIC = [
  "tie_strength",
  "post_age_hours",
  "author_age_days",
  "plot_size_m2",
  "photo_count",
  "caption_words",
  "viewer_posts_30d",
  "author_followers",
  "past_open_rate",
  "past_react_rate",
  "distance_km",
  "frost_days_ahead",
];
/** The categorical features the generated trees split on. */
export const SYNTHETIC_CATEGORICAL = [
  { name: "post_kind", values: ["tip", "swap", "harvest", "question", "pest_alert", "event"] },
  { name: "season", values: ["spring", "summer", "autumn", "winter"] },
  { name: "soil", values: ["clay", "loam", "sand", "chalk", "peat", "silt"] },
];
/** Crops for the hashed-only "crop" feature. */
export const SYNTHETIC_CROPS = [
  "kale",
  "leek",
  "bean",
  "pea",
  "onion",
  "garlic",
  "chard",
  "squash",
  "tomato",
  "beet",
  "carrot",
  "parsnip",
];
const OUTCOMES = ["open", "react", "reply", "save", "reshare", "hide"];

/**
 * A random but well-formed Plotline model (invented data): forests in the
 * implicit complete layout with some early-stopped trees padded by pass-through
 * nodes and some categorical splits, sparse FTRL-like heads over leaves, hashed
 * categoricals, a cross and two standardized numerics. Used by tests, the
 * scorer benchmark and the latency table. Deterministic for a seed.
 *
 * @example
 * const model = syntheticModel({ trees: 100, depth: 6 });
 * buildArtifact(model);
 */
export function syntheticModel(options: SyntheticModelOptions = {}): SyntheticModel {
  const random = seededRandom(options.seed ?? 1);
  const treeTotal = options.trees ?? 100;
  const depth = options.depth ?? 6;
  const forestCount = options.forests ?? 1;
  const outcomes = options.outcomes ?? OUTCOMES;
  const hashBits = options.hashBits ?? 18;
  const contract: FeatureContract = {
    numeric: SYNTHETIC_NUMERIC,
    categorical: [
      ...SYNTHETIC_CATEGORICAL,
      { name: "crop", values: [] },
      { name: "viewer_region", values: [] },
    ],
  };
  const encoding: EncodingSpec = {
    hashBits,
    hashSeed: 0,
    hashed: ["crop", "viewer_region", "post_kind"],
    crosses: [["post_kind", "season"]],
    numeric: [
      { name: "tie_strength", mean: 0.4, std: 0.25 },
      { name: "post_age_hours", mean: 30, std: 22 },
    ],
  };
  const nodes = 2 ** depth - 1;
  const forests: ForestModel[] = [];
  const reachable: boolean[] = [];
  for (let f = 0; f < forestCount; f++) {
    const count = Math.floor(treeTotal / forestCount) + (f < treeTotal % forestCount ? 1 : 0);
    const trees: TreeModel[] = [];
    for (let t = 0; t < count; t++) {
      const tree = randomTree(
        depth,
        nodes,
        random,
        options.categoricalShare ?? 0.1,
        options.stopShare ?? 0.04,
      );
      trees.push(tree.model);
      reachable.push(...tree.reachable);
    }
    forests.push({
      outcome: outcomes[f % outcomes.length],
      baseLogit: -1 - random(),
      depth,
      trees,
    });
  }
  const leafCount = reachable.length;
  const hashedCount = 2 ** hashBits;
  const heads = outcomes.map((outcome): HeadModel => {
    const entries = new Map<number, number>();
    for (let k = 0; k < leafCount; k++) {
      if (reachable[k] && random() < (options.leafDensity ?? 0.5))
        entries.set(k, gaussian(random) * 0.3);
    }
    for (let k = 0; k < (options.hashedPerHead ?? 400); k++) {
      entries.set(leafCount + Math.floor(random() * hashedCount), gaussian(random) * 0.2);
    }
    encoding.numeric.forEach((_, j) =>
      entries.set(leafCount + hashedCount + j, gaussian(random) * 0.1),
    );
    const index = Int32Array.from([...entries.keys()].sort((a, b) => a - b));
    return {
      outcome,
      bias: -2 + gaussian(random) * 0.5,
      index,
      weight: Float64Array.from(index, (i) => entries.get(i) ?? 0),
      negativeKeepRate: outcome === "open" ? 1 : 0.25,
    };
  });
  const valueWeights = Object.fromEntries(
    outcomes.map((outcome, h) => [outcome, outcome === "hide" ? -8 : 1 + h]),
  );
  return { contract, forests, encoding, heads, valueWeights };
}

function randomTree(
  depth: number,
  nodes: number,
  random: () => number,
  categoricalShare: number,
  stopShare: number,
): { model: TreeModel; reachable: boolean[] } {
  const feature = new Int32Array(nodes);
  const threshold = new Float64Array(nodes);
  const missingRight = new Uint8Array(nodes);
  const rightCategories: (Int32Array | null)[] = new Array<Int32Array | null>(nodes).fill(null);
  // A node under a pass-through is itself a pass-through: the tree stopped there.
  const stopped = new Uint8Array(nodes);
  for (let n = 0; n < nodes; n++) {
    const parent = (n - 1) >> 1;
    if ((n > 0 && stopped[parent] === 1) || (n > 0 && random() < stopShare)) {
      stopped[n] = 1;
      feature[n] = -1;
      continue;
    }
    missingRight[n] = random() < 0.5 ? 1 : 0;
    if (random() < categoricalShare) {
      const c = Math.floor(random() * SYNTHETIC_CATEGORICAL.length);
      feature[n] = SYNTHETIC_NUMERIC.length + c;
      const codes: number[] = [];
      SYNTHETIC_CATEGORICAL[c].values.forEach((_, code) => {
        if (random() < 0.4) codes.push(code);
      });
      rightCategories[n] = Int32Array.from(codes);
    } else {
      const f = Math.floor(random() * SYNTHETIC_NUMERIC.length);
      feature[n] = f;
      // Bin edges are data values: a few significant digits.
      threshold[n] = Math.round(random() * 100 * (f + 1)) / 100;
    }
  }
  const leaves = nodes + 1;
  const reachable: boolean[] = [];
  const leafValue = new Float64Array(leaves);
  for (let k = 0; k < leaves; k++) {
    // A leaf is reachable unless it sits in the right subtree of a pass-through node.
    let node = nodes + k;
    let ok = true;
    while (node > 0) {
      const parent = (node - 1) >> 1;
      if (feature[parent] === -1 && node === 2 * parent + 2) ok = false;
      node = parent;
    }
    reachable.push(ok);
    leafValue[k] = ok ? gaussian(random) * 0.1 : 0;
  }
  return { model: { feature, threshold, missingRight, rightCategories, leafValue }, reachable };
}
