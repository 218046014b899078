import type { ScorerArtifact } from "../../scorer/artifact.generated.js";
import { formatArtifactText } from "./format-artifact-text.js";

/** A summary of an artifact for people: sizes, trees, head sparsity, the features the trees use most. */
export interface ArtifactDescription {
  readonly checksum: string;
  readonly formatVersion: number;
  readonly toolVersion: string;
  readonly createdAt: string;
  /** Bytes of the artifact as exportArtifact writes it (UTF-8). */
  readonly bytes: number;
  /** Bytes of each top-level section's compact JSON. */
  readonly sectionBytes: {
    readonly contract: number;
    readonly forests: number;
    readonly heads: number;
    readonly provenance: number;
  };
  readonly features: {
    readonly numeric: number;
    readonly categorical: number;
    readonly hashed: number;
    readonly crosses: number;
    readonly standardized: number;
    readonly hashBits: number;
  };
  readonly forests: readonly {
    readonly outcome: string;
    readonly trees: number;
    readonly depth: number;
    readonly splitNodes: number;
    readonly categoricalNodes: number;
    /** Padding of trees that stopped early. */
    readonly passThroughNodes: number;
  }[];
  /** Size of the heads' encoded index space. */
  readonly encodedWidth: number;
  readonly heads: readonly {
    readonly outcome: string;
    readonly nonZero: number;
    readonly leafWeights: number;
    readonly hashedWeights: number;
    readonly numericWeights: number;
    readonly bias: number;
    readonly negativeKeepRate: number;
    readonly valueWeight: number;
  }[];
  /** Features by number of tree nodes splitting on them, most first. */
  readonly topFeatures: readonly {
    readonly feature: string;
    readonly kind: "numeric" | "categorical";
    readonly splits: number;
    readonly share: number;
  }[];
}

/**
 * Describes a checked artifact (see checkArtifact).
 *
 * @example
 * const description = describeArtifact(artifact);
 * description.heads.map((h) => `${h.outcome}: ${h.nonZero}`); // ["open: 3301", ...]
 */
export function describeArtifact(artifact: ScorerArtifact, top = 10): ArtifactDescription {
  const { contract } = artifact;
  const numericCount = contract.numeric.length;
  const names = [...contract.numeric, ...contract.categorical.map((c) => c.name)];
  const splits = new Float64Array(names.length);
  let leafCount = 0;
  const forests = artifact.forests.map((forest) => {
    let splitNodes = 0;
    let categoricalNodes = 0;
    let passThroughNodes = 0;
    for (const f of forest.feature) {
      if (f < 0) passThroughNodes++;
      else {
        splitNodes++;
        splits[f]++;
        if (f >= numericCount) categoricalNodes++;
      }
    }
    leafCount += forest.treeCount * 2 ** forest.depth;
    return {
      outcome: forest.outcome,
      trees: forest.treeCount,
      depth: forest.depth,
      splitNodes,
      categoricalNodes,
      passThroughNodes,
    };
  });
  const hashedOffset = leafCount;
  const numericOffset = hashedOffset + 2 ** contract.hashing.bits;
  const heads = artifact.heads.map((head) => {
    let leafWeights = 0;
    let hashedWeights = 0;
    let index = 0;
    head.indexDelta.forEach((delta, i) => {
      index = i === 0 ? delta : index + delta;
      if (index < hashedOffset) leafWeights++;
      else if (index < numericOffset) hashedWeights++;
    });
    const nonZero = head.indexDelta.length;
    return {
      outcome: head.outcome,
      nonZero,
      leafWeights,
      hashedWeights,
      numericWeights: nonZero - leafWeights - hashedWeights,
      bias: head.bias,
      negativeKeepRate: head.negativeKeepRate,
      valueWeight: head.valueWeight,
    };
  });
  const totalSplits = splits.reduce((a, b) => a + b, 0);
  const topFeatures = names
    .map((feature, f) => ({
      feature,
      kind: f < numericCount ? ("numeric" as const) : ("categorical" as const),
      splits: splits[f],
      share: totalSplits > 0 ? splits[f] / totalSplits : 0,
    }))
    .filter((entry) => entry.splits > 0)
    .sort((a, b) => b.splits - a.splits || (a.feature < b.feature ? -1 : 1))
    .slice(0, top);
  const size = (value: unknown): number => new TextEncoder().encode(JSON.stringify(value)).length;
  return {
    checksum: artifact.checksum,
    formatVersion: artifact.formatVersion,
    toolVersion: artifact.provenance.toolVersion,
    createdAt: artifact.provenance.createdAt,
    bytes: new TextEncoder().encode(formatArtifactText(artifact)).length,
    sectionBytes: {
      contract: size(artifact.contract),
      forests: size(artifact.forests),
      heads: size(artifact.heads),
      provenance: size(artifact.provenance),
    },
    features: {
      numeric: numericCount,
      categorical: contract.categorical.length,
      hashed: contract.hashing.columns.length,
      crosses: contract.hashing.crosses.length,
      standardized: contract.standardized.length,
      hashBits: contract.hashing.bits,
    },
    forests,
    encodedWidth: numericOffset + contract.standardized.length,
    heads,
    topFeatures,
  };
}
