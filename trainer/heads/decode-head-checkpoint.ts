import { checkJsonSchema, type JsonSchema } from "../../scorer/json-schema-check.js";
import type { ReadStats } from "../data/read-types.js";
import { inputFileIdentitySchema, type InputFileIdentity } from "../io/input-file-identity.js";
import { decodeHeadState } from "./decode-head-state.js";
import type { HeadState } from "./head-state.js";
import {
  HEAD_CHECKPOINT_MAGIC,
  HEAD_CHECKPOINT_VERSION,
  type HeadCheckpoint,
} from "./head-checkpoint.js";
import { damagedCheckpointError } from "../io/damaged-checkpoint-error.js";

const count = { type: "integer", minimum: 0 };
const headerSchema: JsonSchema = {
  type: "object",
  required: ["inputs", "position", "reads"],
  properties: {
    inputs: {
      type: "object",
      required: ["files", "start", "batchRows", "badRows"],
      properties: {
        files: { type: "array", items: inputFileIdentitySchema },
        start: { anyOf: [{ type: "string" }, { type: "null" }] },
        batchRows: count,
        badRows: { enum: ["fail", "skip"] },
      },
    },
    position: {
      type: "object",
      required: ["file", "rows"],
      properties: { file: count, rows: count },
    },
    reads: {
      type: "array",
      items: {
        type: "object",
        required: ["file", "rowsAccepted", "rowsRejected", "rejectsPath", "rejectedByCode"],
        properties: {
          file: { type: "string" },
          rowsAccepted: count,
          rowsRejected: count,
          rejectsPath: { anyOf: [{ type: "string" }, { type: "null" }] },
          rejectedByCode: { type: "object", additionalProperties: count },
        },
      },
    },
  },
};

interface HeaderDocument {
  inputs: {
    files: InputFileIdentity[];
    start: string | null;
    batchRows: number;
    badRows: "fail" | "skip";
  };
  position: { file: number; rows: number };
  reads: ReadStats[];
}

/**
 * Reads a head checkpoint written by encodeHeadCheckpoint, checking the magic,
 * the header and the head state inside; `file` labels errors (LeafcastError
 * from "checkpoint", code "damaged_checkpoint").
 *
 * @example
 * const checkpoint = decodeHeadCheckpoint(await readFile(path), path);
 * checkpoint.position; // { file: 1, rows: 65536 }
 */
export function decodeHeadCheckpoint(bytes: Uint8Array, file = "<checkpoint>"): HeadCheckpoint {
  const fail = (message: string): never => {
    throw damagedCheckpointError(message, file);
  };
  const magic = new TextDecoder().decode(bytes.subarray(0, 8));
  if (bytes.length < 16 || magic !== HEAD_CHECKPOINT_MAGIC) {
    fail(
      `expected a head checkpoint starting "${HEAD_CHECKPOINT_MAGIC}", found ${JSON.stringify(magic)}`,
    );
  }
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const version = view.getUint32(8, true);
  const headerBytes = view.getUint32(12, true);
  if (version !== HEAD_CHECKPOINT_VERSION) {
    fail(`expected head-checkpoint version ${HEAD_CHECKPOINT_VERSION}, found ${version}`);
  }
  if (headerBytes % 8 !== 0 || 16 + headerBytes > bytes.length) {
    fail(`expected a header of ${headerBytes} bytes, found a file of ${bytes.length} bytes`);
  }
  let document: unknown;
  try {
    document = JSON.parse(new TextDecoder().decode(bytes.subarray(16, 16 + headerBytes)));
  } catch {
    fail("expected a JSON header, found text that does not parse");
  }
  const issues = checkJsonSchema(headerSchema, document);
  if (issues.length > 0) fail(`header ${issues[0].path || "/"}: ${issues[0].message}`);
  const header = document as HeaderDocument;
  return {
    inputs: header.inputs,
    position: header.position,
    reads: header.reads,
    state: decodeInnerState(bytes.subarray(16 + headerBytes), file, fail),
  };
}

function decodeInnerState(
  bytes: Uint8Array,
  file: string,
  fail: (message: string) => never,
): HeadState {
  try {
    return decodeHeadState(bytes, file);
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    return fail(`the head state inside is damaged (${reason})`);
  }
}
