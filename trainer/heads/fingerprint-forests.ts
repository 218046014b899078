import { createHash } from "node:crypto";
import type { FeatureContract, ForestModel } from "../../scorer/model-types.js";

/**
 * A fingerprint of trees (and optionally the feature contract they index into):
 * SHA-256 over every number that decides which leaf a row reaches and the leaf
 * layout. Head states record it, because a head's leaf coordinates mean nothing
 * under other trees; equal trees give equal fingerprints however they were stored.
 *
 * @example
 * fingerprintForests(forests, contract); // "sha256:3f1c..."
 */
export function fingerprintForests(
  forests: readonly ForestModel[],
  contract?: FeatureContract,
): string {
  const hash = createHash("sha256");
  const bytes = (a: ArrayBufferView): void => {
    hash.update(new Uint8Array(a.buffer, a.byteOffset, a.byteLength));
  };
  if (contract !== undefined) hash.update(JSON.stringify(contract));
  hash.update(`forests:${forests.length};`);
  for (const forest of forests) {
    hash.update(JSON.stringify([forest.outcome, forest.depth, forest.trees.length]));
    bytes(Float64Array.of(forest.baseLogit));
    for (const tree of forest.trees) {
      bytes(tree.feature);
      bytes(tree.threshold);
      bytes(tree.missingRight);
      bytes(tree.leafValue);
      for (const categories of tree.rightCategories) {
        if (categories === null) hash.update("-");
        else {
          hash.update(`c${categories.length}:`);
          bytes(categories);
        }
      }
    }
  }
  return `sha256:${hash.digest("hex")}`;
}
