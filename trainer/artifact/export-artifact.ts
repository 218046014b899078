import { writeFileAtomic } from "../io/write-file-atomic.js";
import { buildArtifact, type ArtifactInput } from "./build-artifact.js";
import { formatArtifactText } from "./format-artifact-text.js";

/** What exportArtifact wrote. */
export interface ExportedArtifact {
  readonly path: string;
  /** Size of the file in bytes. */
  readonly bytes: number;
  readonly checksum: string;
}

/**
 * Builds an artifact from trained forests and heads (see buildArtifact) and writes
 * it atomically: a reader sees the old file or the complete new one, never a torn
 * write.
 *
 * @example
 * const { bytes, checksum } = await exportArtifact("runs/demo/model.json", { contract, forests, encoding, heads });
 */
export async function exportArtifact(
  path: string,
  input: ArtifactInput,
): Promise<ExportedArtifact> {
  const artifact = buildArtifact(input);
  const data = new TextEncoder().encode(formatArtifactText(artifact));
  await writeFileAtomic(path, data);
  return { path, bytes: data.length, checksum: artifact.checksum };
}
