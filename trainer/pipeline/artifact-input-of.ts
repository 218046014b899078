import type { ArtifactInput, ProvenanceInput } from "../artifact/build-artifact.js";
import { exportHeadModels } from "../heads/export-head-models.js";
import type { HeadState } from "../heads/head-state.js";
import type { ForestFile } from "../trees/forest-file.js";

/**
 * What an artifact is built from, given the saved forests and the heads learned
 * over their leaves: the forests' contract and trees, the heads' encoding and
 * non-zero weights, and the caller's value weights and provenance.
 *
 * @example
 * await exportArtifact("runs/demo/model.json", artifactInputOf(forests, state, { hide: -10 }));
 */
export function artifactInputOf(
  forestFile: ForestFile,
  state: HeadState,
  valueWeights: Readonly<Record<string, number>> = {},
  provenance: ProvenanceInput = {},
): ArtifactInput {
  return {
    contract: forestFile.contract,
    forests: forestFile.forests.map((f) => f.forest),
    encoding: state.info.encoding,
    heads: exportHeadModels(state),
    valueWeights,
    provenance,
  };
}
