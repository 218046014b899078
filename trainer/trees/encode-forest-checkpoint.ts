import { createHash } from "node:crypto";
import {
  FOREST_CHECKPOINT_FORMAT,
  FOREST_CHECKPOINT_VERSION,
  type ForestCheckpoint,
} from "./forest-checkpoint.js";

/**
 * Serializes a tree-fitting checkpoint as one JSON document. Every array of
 * numbers is stored as the base64 of its little-endian bytes, so each float
 * (NaN and -0 included) comes back bit for bit; a SHA-256 over the rest lets
 * decodeForestCheckpoint tell a damaged file from a good one.
 *
 * @example
 * await writeFileAtomic("forests.json.checkpoint", encodeForestCheckpoint(checkpoint));
 */
export function encodeForestCheckpoint(checkpoint: ForestCheckpoint): string {
  const body = {
    inputs: checkpoint.inputs,
    forests: checkpoint.forests.map((forest) => ({
      outcome: forest.outcome,
      complete: forest.complete,
      startLoss: bytes64(
        Float64Array.of(forest.startTrainLoss, forest.startValidationLoss ?? Number.NaN),
      ),
      hasValidation: forest.validationLoss !== null,
      trainLoss: bytes64(Float64Array.from(forest.trainLoss)),
      validationLoss: bytes64(Float64Array.from(forest.validationLoss ?? [])),
      trees: forest.trees.map((tree) => ({
        depth: tree.depth,
        column: bytes64(tree.column),
        threshold: bytes64(tree.threshold),
        missingRight: bytes64(tree.missingRight),
        rightBins: tree.rightBins.map((bins) => (bins === null ? null : bytes64(bins))),
        gain: bytes64(tree.gain),
        cover: bytes64(tree.cover),
        leafNode: bytes64(Int32Array.from(tree.leaves, (leaf) => leaf.node)),
        leafDepth: bytes64(Int32Array.from(tree.leaves, (leaf) => leaf.depth)),
        leafValue: bytes64(Float64Array.from(tree.leaves, (leaf) => leaf.value)),
      })),
    })),
  };
  const text = JSON.stringify(body);
  const checksum = `sha256:${createHash("sha256").update(text).digest("hex")}`;
  // The body is kept as text inside the document, so the checksum covers exactly what is read back.
  return `${JSON.stringify({ format: FOREST_CHECKPOINT_FORMAT, version: FOREST_CHECKPOINT_VERSION, checksum, body: text })}\n`;
}

function bytes64(view: ArrayBufferView): string {
  return Buffer.from(view.buffer, view.byteOffset, view.byteLength).toString("base64");
}
