import type { ScorerArtifact } from "../../scorer/artifact.generated.js";
import { artifactChecksum } from "../../scorer/artifact-checksum.js";
import { ARTIFACT_FORMAT, ARTIFACT_FORMAT_VERSION } from "../../scorer/artifact-format.js";
import { checkScoringModel } from "../../scorer/check-scoring-model.js";
import type {
  EncodingSpec,
  FeatureContract,
  ForestModel,
  HeadModel,
  ScoringModel,
} from "../../scorer/model-types.js";
import { LeafcastError } from "../errors.js";
import { toolVersion } from "../tool-version.js";

/** Where the model's data came from, for the artifact's provenance. */
export interface ProvenanceInput {
  readonly name?: string;
  readonly dataWindows?: readonly {
    /** What learned from it: "trees", "heads", ... */
    readonly stage: string;
    readonly files?: readonly string[];
    readonly rows: number;
    readonly from: Date | string | null;
    readonly to: Date | string | null;
  }[];
  /** Per outcome: metric name to value. Non-finite values are left out (JSON cannot hold them). */
  readonly metrics?: Readonly<Record<string, Readonly<Record<string, number>>>>;
  /** Default: now. */
  readonly createdAt?: Date;
}

/** What an artifact is built from: the trainer's in-memory model and its provenance. */
export interface ArtifactInput {
  readonly contract: FeatureContract;
  readonly forests: readonly ForestModel[];
  readonly encoding: EncodingSpec;
  readonly heads: readonly HeadModel[];
  /** Outcome to its weight in the combined ranking score; outcomes not listed weigh 1 (give "hide" a negative weight). */
  readonly valueWeights?: Readonly<Record<string, number>>;
  readonly provenance?: ProvenanceInput;
}

/**
 * Builds a scorer artifact (schemas/scorer-artifact.schema.json) from trained
 * forests and heads, with its checksum. Columns the encoding reads but the
 * contract lacks (categoricals only the heads hash, numerics only the heads
 * read) are added to the contract, and tree feature indexes shifted to match.
 * Zero head weights are dropped. Throws a LeafcastError("artifact") listing
 * every problem of the model.
 *
 * @example
 * const artifact = buildArtifact({ contract, forests, encoding, heads, valueWeights: { hide: -8 } });
 * artifact.checksum; // "sha256:..."
 */
export function buildArtifact(input: ArtifactInput): ScorerArtifact {
  const model = completeModel(input);
  const issues = checkScoringModel(model);
  if (issues.length > 0) {
    throw new LeafcastError(
      "artifact",
      issues.map((issue) => ({ code: issue.code, message: `${issue.path}: ${issue.message}` })),
    );
  }
  const { contract, encoding } = model;
  const numericCount = contract.numeric.length;
  const artifact: ScorerArtifact = {
    format: ARTIFACT_FORMAT,
    formatVersion: ARTIFACT_FORMAT_VERSION,
    checksum: "",
    contract: {
      numeric: [...contract.numeric],
      categorical: contract.categorical.map((c) => ({ name: c.name, values: [...c.values] })),
      missingValues: "tree-default-direction",
      hashing: {
        function: "murmur3-x86-32",
        keyFormat: "{column}={value}&{column}={value}",
        bits: encoding.hashBits,
        seed: encoding.hashSeed,
        columns: [...encoding.hashed],
        crosses: encoding.crosses.map((cross) => [...cross]),
      },
      standardized: encoding.numeric.map((s) => ({ feature: s.name, mean: s.mean, std: s.std })),
    },
    forests: model.forests.map((forest) => flattenForest(forest, numericCount)),
    heads: model.heads.map((head, h) => {
      const indexDelta: number[] = [];
      const weight: number[] = [];
      let previous = 0;
      for (let i = 0; i < head.index.length; i++) {
        if (head.weight[i] !== 0) {
          indexDelta.push(head.index[i] - previous);
          previous = head.index[i];
          weight.push(head.weight[i]);
        }
      }
      return {
        outcome: head.outcome,
        bias: head.bias,
        indexDelta,
        weight,
        negativeKeepRate: head.negativeKeepRate,
        valueWeight: model.valueWeights[h],
      };
    }),
    provenance: provenance(input.provenance ?? {}),
  };
  artifact.checksum = artifactChecksum(artifact);
  return artifact;
}

/** The model with encoding-only columns added to the contract and value weights resolved. */
function completeModel(input: ArtifactInput): ScoringModel {
  const { contract, encoding } = input;
  const known = new Set([...contract.numeric, ...contract.categorical.map((c) => c.name)]);
  const extraNumeric = [...new Set(encoding.numeric.map((s) => s.name))].filter(
    (name) => !known.has(name),
  );
  const extraCategorical = [...new Set([...encoding.hashed, ...encoding.crosses.flat()])].filter(
    (name) => !known.has(name),
  );
  const numericCount = contract.numeric.length;
  const shift = extraNumeric.length;
  const forests =
    shift === 0
      ? input.forests
      : input.forests.map((forest) => ({
          ...forest,
          trees: forest.trees.map((tree) => ({
            ...tree,
            feature: tree.feature.map((f) => (f >= numericCount ? f + shift : f)),
          })),
        }));
  const weights = input.valueWeights ?? {};
  return {
    contract: {
      numeric: [...contract.numeric, ...extraNumeric],
      categorical: [
        ...contract.categorical,
        ...extraCategorical.map((name) => ({ name, values: [] })),
      ],
    },
    forests,
    encoding,
    heads: input.heads,
    valueWeights: input.heads.map((head) =>
      Object.prototype.hasOwnProperty.call(weights, head.outcome)
        ? (weights[head.outcome] ?? 1)
        : 1,
    ),
  };
}

function flattenForest(
  forest: ForestModel,
  numericCount: number,
): ScorerArtifact["forests"][number] {
  const feature: number[] = [];
  const threshold: number[] = [];
  const missingRight: number[] = [];
  const categorySplits: number[] = [];
  const leafValue: number[] = [];
  const nodes = 2 ** forest.depth - 1;
  forest.trees.forEach((tree, t) => {
    for (let n = 0; n < nodes; n++) {
      const f = tree.feature[n];
      feature.push(f);
      // Pass-through and categorical nodes ignore the threshold; 0 keeps the file short.
      threshold.push(f >= 0 && f < numericCount ? tree.threshold[n] : 0);
      missingRight.push(f >= 0 ? tree.missingRight[n] : 0);
      const right = tree.rightCategories[n];
      if (f >= numericCount && right !== null && right.length > 0) {
        categorySplits.push(t * nodes + n, right.length, ...right);
      }
    }
    for (const value of tree.leafValue) leafValue.push(value);
  });
  return {
    outcome: forest.outcome,
    baseLogit: forest.baseLogit,
    depth: forest.depth,
    treeCount: forest.trees.length,
    feature,
    threshold,
    missingRight,
    categorySplits,
    leafValue,
  };
}

function provenance(input: ProvenanceInput): ScorerArtifact["provenance"] {
  const time = (value: Date | string | null): string | null =>
    value instanceof Date ? value.toISOString() : value;
  // fromEntries defines own properties, so an outcome named "__proto__" stays data.
  const metrics = Object.fromEntries(
    Object.entries(input.metrics ?? {}).map(([outcome, values]) => [
      outcome,
      Object.fromEntries(Object.entries(values).filter(([, value]) => Number.isFinite(value))),
    ]),
  );
  return {
    ...(input.name !== undefined ? { name: input.name } : {}),
    toolVersion,
    createdAt: (input.createdAt ?? new Date()).toISOString(),
    dataWindows: (input.dataWindows ?? []).map((w) => ({
      stage: w.stage,
      ...(w.files !== undefined ? { files: [...w.files] } : {}),
      rows: w.rows,
      from: time(w.from),
      to: time(w.to),
    })),
    metrics,
  };
}
