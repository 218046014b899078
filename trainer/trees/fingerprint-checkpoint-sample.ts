import { createHash } from "node:crypto";
import type { BinnedFeatures } from "./binned-features.js";
import type { ForestTarget } from "./fit-forests.js";

/**
 * SHA-256 over everything of a binned sample that decides the trees: the bins,
 * the bin layout and edges, the feature contract, each target's outcome and
 * labels, and the weights and times (or their absence). A checkpoint records
 * it, and a run resumes from the checkpoint only over the very same sample.
 *
 * @example
 * fingerprintCheckpointSample(binned, targets, weight, timestamp); // "sha256:..."
 */
export function fingerprintCheckpointSample(
  binned: BinnedFeatures,
  targets: readonly ForestTarget[],
  weight: Float64Array | null,
  timestamp: Float64Array | null,
): string {
  const hash = createHash("sha256");
  const bytes = (a: ArrayBufferView | null): void => {
    if (a === null) hash.update("-;");
    else {
      hash.update(`${a.byteLength}:`);
      hash.update(new Uint8Array(a.buffer, a.byteOffset, a.byteLength));
    }
  };
  hash.update(JSON.stringify([binned.rowCount, binned.columnCount, binned.contract]));
  bytes(binned.bins);
  bytes(binned.columnFeature);
  bytes(binned.columnCategorical);
  bytes(binned.valueBins);
  for (const edges of binned.edges) bytes(edges);
  for (const target of targets) {
    hash.update(JSON.stringify(target.outcome));
    bytes(target.label);
  }
  bytes(weight);
  bytes(timestamp);
  return `sha256:${hash.digest("hex")}`;
}
