import { canonicalJson } from "./canonical-json.js";
import { sha256Hex } from "./sha256.js";

/**
 * The checksum an artifact must carry: "sha256:" and the hex SHA-256 of the UTF-8
 * bytes of its canonical form without the checksum field (see canonicalJson).
 *
 * @example
 * const artifact = { ...fields, checksum: "" };
 * artifact.checksum = artifactChecksum(artifact); // "sha256:3b1f..."
 */
export function artifactChecksum(artifact: unknown): string {
  return `sha256:${sha256Hex(canonicalJson(artifact, "checksum"))}`;
}
