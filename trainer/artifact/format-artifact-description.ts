import type { ArtifactDescription } from "./describe-artifact.js";

/**
 * The text a person reads for describeArtifact's result.
 *
 * @example
 * console.log(formatArtifactDescription(describeArtifact(artifact)));
 */
export function formatArtifactDescription(d: ArtifactDescription): string {
  const kb = (bytes: number): string => `${(bytes / 1024).toFixed(1)} KiB`;
  const count = (n: number, one: string, many = `${one}s`): string =>
    `${n} ${n === 1 ? one : many}`;
  const lines = [
    `artifact: format version ${d.formatVersion}, ${kb(d.bytes)} (${d.bytes} bytes), ${d.checksum}`,
    `written by leafcast ${d.toolVersion} at ${d.createdAt}`,
    `sections: contract ${kb(d.sectionBytes.contract)}, forests ${kb(d.sectionBytes.forests)}, heads ${kb(d.sectionBytes.heads)}, provenance ${kb(d.sectionBytes.provenance)}`,
    `features: ${d.features.numeric} numeric, ${d.features.categorical} categorical; heads hash ${count(d.features.hashed, "column")} and ${count(d.features.crosses, "cross", "crosses")} into 2^${d.features.hashBits} buckets, read ${count(d.features.standardized, "standardized numeric")}`,
    "forests:",
    ...d.forests.map(
      (f) =>
        `  ${f.outcome}: ${f.trees} trees of depth ${f.depth}, ${f.splitNodes} splits (${f.categoricalNodes} categorical), ${f.passThroughNodes} pass-through nodes`,
    ),
    `heads (encoded width ${d.encodedWidth}):`,
    ...d.heads.map(
      (h) =>
        `  ${h.outcome}: ${h.nonZero} non-zero weights (${h.leafWeights} leaves, ${h.hashedWeights} hashed, ${h.numericWeights} numeric), bias ${h.bias.toFixed(4)}, negative keep rate ${h.negativeKeepRate}, value weight ${h.valueWeight}`,
    ),
    "top features by tree splits:",
    ...d.topFeatures.map(
      (f) => `  ${f.feature} (${f.kind}): ${f.splits} splits, ${(100 * f.share).toFixed(1)} %`,
    ),
  ];
  return lines.join("\n");
}
