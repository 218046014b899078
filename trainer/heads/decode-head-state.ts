import { checkJsonSchema } from "../../scorer/json-schema-check.js";
import { LeafcastError, type Issue } from "../errors.js";
import { HEAD_STATE_MAGIC, LITTLE_ENDIAN } from "./encode-head-state.js";
import {
  headStateHeaderSchema,
  READABLE_HEAD_STATE_VERSIONS,
  type HeadStateHeader,
} from "./head-state-header.js";
import { COORDINATE_PAGE_SHIFT, HeadState } from "./head-state.js";
import { STAT_FIELDS } from "./progressive-stats.js";

/**
 * Reads the bytes of a head-state file (layout in encode-head-state.ts) back into
 * a state, checking the magic, the header and every section's size first; `file`
 * only labels errors.
 *
 * @example
 * const state = decodeHeadState(await readFile("runs/demo/heads.state"), "heads.state");
 */
export function decodeHeadState(bytes: Uint8Array, file = "<head state>"): HeadState {
  const fail = (code: string, message: string): never => {
    throw new LeafcastError("heads", [{ code, message, file }]);
  };
  if (!LITTLE_ENDIAN) fail("byte_order", "expected a little-endian host, found big-endian");
  const magic = new TextDecoder().decode(bytes.subarray(0, 8));
  if (bytes.length < 16 || magic !== HEAD_STATE_MAGIC) {
    fail(
      "not_head_state",
      `expected a head-state file starting "${HEAD_STATE_MAGIC}", found ${JSON.stringify(magic)}`,
    );
  }
  // Typed-array views need 8-byte alignment in the underlying buffer.
  const data = bytes.byteOffset % 8 === 0 ? bytes : new Uint8Array(bytes);
  const view = new DataView(data.buffer, data.byteOffset, data.byteLength);
  const version = view.getUint32(8, true);
  const headerBytes = view.getUint32(12, true);
  if (!READABLE_HEAD_STATE_VERSIONS.includes(version)) {
    fail(
      "unsupported_version",
      `expected head-state version ${READABLE_HEAD_STATE_VERSIONS.join(" or ")}, found ${version}`,
    );
  }
  if (headerBytes % 8 !== 0 || 16 + headerBytes > data.length) {
    fail(
      "truncated",
      `expected a header of ${headerBytes} bytes, found a file of ${data.length} bytes`,
    );
  }
  let document: unknown;
  try {
    document = JSON.parse(new TextDecoder().decode(data.subarray(16, 16 + headerBytes)));
  } catch {
    fail("invalid_header", "expected a JSON header, found text that does not parse");
  }
  const issues: Issue[] = checkJsonSchema(headStateHeaderSchema, document).map((issue) => ({
    code: "invalid_header",
    message: `header ${issue.path || "/"}: ${issue.message}`,
    file,
  }));
  if (issues.length > 0) throw new LeafcastError("heads", issues);
  const header = document as HeadStateHeader;
  if (header.version !== version) {
    fail(
      "invalid_header",
      `expected the header's version to be the file's, ${version}, found ${header.version}`,
    );
  }
  // Version 1 files predate averaging.
  const info = { ...header.info, averaging: header.info.averaging ?? null };
  const averaged = info.averaging !== null;
  if (averaged !== (header.averageMass !== undefined) || (averaged && version < 2)) {
    fail(
      "invalid_header",
      `expected averageMass exactly when info.averaging is set (version 2), found averaging ${JSON.stringify(info.averaging)} and averageMass ${JSON.stringify(header.averageMass)} in version ${version}`,
    );
  }
  const heads = info.outcomes.length;
  if (info.negativeKeepRate.length !== heads || header.statFields !== STAT_FIELDS) {
    fail(
      "invalid_header",
      `expected ${heads} keep rates and ${STAT_FIELDS} stat fields, found ${info.negativeKeepRate.length} and ${header.statFields}`,
    );
  }
  const stored = header.storedCoordinates;
  const slices = header.sliceIndexes.length;
  const coordinateBytes = Math.ceil((stored * 4) / 8) * 8;
  const expected =
    16 +
    headerBytes +
    coordinateBytes +
    8 * ((averaged ? 3 : 2) * stored * heads + (1 + slices) * heads * STAT_FIELDS);
  if (data.length !== expected) {
    fail(
      "truncated",
      `expected ${expected} bytes for ${stored} coordinates and ${slices} slices, found ${data.length}`,
    );
  }

  const state = new HeadState(info);
  let at = 16 + headerBytes;
  const coordinates = new Uint32Array(data.buffer, data.byteOffset + at, stored);
  at += coordinateBytes;
  const z = new Float64Array(data.buffer, data.byteOffset + at, stored * heads);
  at += 8 * stored * heads;
  const n = new Float64Array(data.buffer, data.byteOffset + at, stored * heads);
  at += 8 * stored * heads;
  const average = averaged
    ? new Float64Array(data.buffer, data.byteOffset + at, stored * heads)
    : null;
  if (averaged) at += 8 * stored * heads;
  let previous = -1;
  for (let k = 0; k < stored; k++) {
    const c = coordinates[k];
    if (c <= previous || c >= state.coordinateCount) {
      fail(
        "invalid_coordinates",
        `expected ascending coordinates below ${state.coordinateCount}, found ${c} after ${previous}`,
      );
    }
    previous = c;
    state.z.set(z.subarray(k * heads, (k + 1) * heads), c * heads);
    state.n.set(n.subarray(k * heads, (k + 1) * heads), c * heads);
    if (average !== null) {
      state.average?.set(average.subarray(k * heads, (k + 1) * heads), c * heads);
    }
    state.writtenPages[c >>> COORDINATE_PAGE_SHIFT] = 1;
  }
  const overall = new Float64Array(data.buffer, data.byteOffset + at, heads * STAT_FIELDS);
  at += 8 * heads * STAT_FIELDS;
  const sliceStats = new Float64Array(
    data.buffer,
    data.byteOffset + at,
    slices * heads * STAT_FIELDS,
  );
  state.progressive.restore(overall, header.sliceIndexes, sliceStats);
  state.rowCount = header.rowCount;
  state.averageMass = header.averageMass ?? 0;
  state.firstTimestamp = header.firstTimestamp;
  state.lastTimestamp = header.lastTimestamp;
  return state;
}
