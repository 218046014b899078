import { createHash } from "node:crypto";
import { checkJsonSchema } from "../../scorer/json-schema-check.js";
import type { InputFileIdentity } from "../io/input-file-identity.js";
import {
  FOREST_CHECKPOINT_FORMAT,
  FOREST_CHECKPOINT_VERSION,
  type ForestCheckpoint,
  type ForestProgress,
} from "./forest-checkpoint.js";
import { forestCheckpointSchema } from "./forest-checkpoint-schema.js";
import type { GrownTree } from "./grown-tree.js";
import { damagedCheckpointError } from "../io/damaged-checkpoint-error.js";

interface TreeDocument {
  depth: number;
  column: string;
  threshold: string;
  missingRight: string;
  rightBins: (string | null)[];
  gain: string;
  cover: string;
  leafNode: string;
  leafDepth: string;
  leafValue: string;
}

interface BodyDocument {
  inputs: {
    files: InputFileIdentity[];
    schema: string;
    settings: string;
    sample: string;
  };
  forests: {
    outcome: string;
    complete: boolean;
    startLoss: string;
    hasValidation: boolean;
    trainLoss: string;
    validationLoss: string;
    trees: TreeDocument[];
  }[];
}

/**
 * Reads a tree-fitting checkpoint written by encodeForestCheckpoint, checking
 * its format, its checksum and the length of every array; `file` labels
 * errors (LeafcastError from "checkpoint", code "damaged_checkpoint" when the
 * file is not a whole checkpoint).
 *
 * @example
 * const checkpoint = decodeForestCheckpoint(await readFile(path, "utf8"), path);
 */
export function decodeForestCheckpoint(source: string, file = "<checkpoint>"): ForestCheckpoint {
  const fail = (message: string): never => {
    throw damagedCheckpointError(message, file);
  };
  let outer: unknown;
  try {
    outer = JSON.parse(source);
  } catch {
    fail("expected a JSON tree-fitting checkpoint, found text that does not parse");
  }
  const head = outer as { format?: unknown; version?: unknown; checksum?: unknown; body?: unknown };
  if (typeof outer !== "object" || outer === null || head.format !== FOREST_CHECKPOINT_FORMAT) {
    fail(`expected format "${FOREST_CHECKPOINT_FORMAT}", found ${JSON.stringify(head?.format)}`);
  }
  if (head.version !== FOREST_CHECKPOINT_VERSION) {
    fail(`expected version ${FOREST_CHECKPOINT_VERSION}, found ${JSON.stringify(head.version)}`);
  }
  if (typeof head.body !== "string" || typeof head.checksum !== "string") {
    fail("expected a body and a checksum");
  }
  const body = head.body as string;
  const checksum = `sha256:${createHash("sha256").update(body).digest("hex")}`;
  if (checksum !== head.checksum)
    fail(`expected checksum ${String(head.checksum)}, found ${checksum}`);
  const document: unknown = JSON.parse(body);
  const issues = checkJsonSchema(forestCheckpointSchema, document);
  if (issues.length > 0) fail(`${issues[0].path || "/"}: ${issues[0].message}`);
  const doc = document as BodyDocument;
  const forests = doc.forests.map((forest, f): ForestProgress => {
    const at = `/forests/${f}`;
    const start = floats(forest.startLoss, `${at}/startLoss`, fail);
    const trainLoss = Array.from(floats(forest.trainLoss, `${at}/trainLoss`, fail));
    const validationLoss = Array.from(floats(forest.validationLoss, `${at}/validationLoss`, fail));
    const trees = forest.trees.map((tree, t) => decodeTree(tree, `${at}/trees/${t}`, fail));
    if (
      start.length !== 2 ||
      trainLoss.length !== trees.length ||
      validationLoss.length !== (forest.hasValidation ? trees.length : 0)
    ) {
      fail(`${at}: expected 2 start losses and one loss per tree`);
    }
    return {
      outcome: forest.outcome,
      complete: forest.complete,
      startTrainLoss: start[0],
      startValidationLoss: forest.hasValidation ? start[1] : null,
      trees,
      trainLoss,
      validationLoss: forest.hasValidation ? validationLoss : null,
    };
  });
  return { inputs: doc.inputs, forests };
}

function decodeTree(tree: TreeDocument, at: string, fail: (message: string) => never): GrownTree {
  const internal = 2 ** tree.depth - 1;
  const column = new Int32Array(aligned(tree.column, 4, `${at}/column`, fail));
  const threshold = new Int32Array(aligned(tree.threshold, 4, `${at}/threshold`, fail));
  const missingRight = new Uint8Array(aligned(tree.missingRight, 1, `${at}/missingRight`, fail));
  const gain = floats(tree.gain, `${at}/gain`, fail);
  const cover = floats(tree.cover, `${at}/cover`, fail);
  const node = new Int32Array(aligned(tree.leafNode, 4, `${at}/leafNode`, fail));
  const depth = new Int32Array(aligned(tree.leafDepth, 4, `${at}/leafDepth`, fail));
  const value = floats(tree.leafValue, `${at}/leafValue`, fail);
  const lengths = [column, threshold, missingRight, gain, cover, tree.rightBins];
  if (lengths.some((a) => a.length !== internal)) {
    fail(`${at}: expected node arrays of ${internal} entries (depth ${tree.depth})`);
  }
  if (node.length === 0 || depth.length !== node.length || value.length !== node.length) {
    fail(`${at}: expected one node, depth and value per leaf`);
  }
  const leaves = Array.from(node, (n, i) => ({ node: n, depth: depth[i], value: value[i] }));
  for (const leaf of leaves) {
    const first = 2 ** leaf.depth - 1;
    if (leaf.depth > tree.depth || leaf.node < first || leaf.node >= 2 * first + 1) {
      fail(`${at}: expected leaves inside a tree of depth ${tree.depth}, found node ${leaf.node}`);
    }
  }
  return {
    depth: tree.depth,
    column,
    threshold,
    missingRight,
    rightBins: tree.rightBins.map((bins, i) =>
      bins === null ? null : new Uint8Array(aligned(bins, 1, `${at}/rightBins/${i}`, fail)),
    ),
    gain,
    cover,
    leaves,
  };
}

function floats(base64: string, at: string, fail: (message: string) => never): Float64Array {
  return new Float64Array(aligned(base64, 8, at, fail));
}

/** The decoded bytes in a buffer of their own (typed-array views need aligned offsets). */
function aligned(
  base64: string,
  width: number,
  at: string,
  fail: (message: string) => never,
): ArrayBuffer {
  const bytes = Buffer.from(base64, "base64");
  if (bytes.length % width !== 0) fail(`${at}: expected whole ${width}-byte numbers`);
  const copy = new Uint8Array(bytes.length);
  copy.set(bytes);
  return copy.buffer;
}
