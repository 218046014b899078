import { LeafcastError } from "../errors.js";
import {
  HEAD_STATE_FORMAT,
  HEAD_STATE_VERSION,
  type HeadStateHeader,
} from "./head-state-header.js";
import type { HeadState } from "./head-state.js";
import { STAT_FIELDS } from "./progressive-stats.js";

/** true on every host Node runs on today; the file format is little-endian. */
export const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

/** First 8 bytes of every head-state file. */
export const HEAD_STATE_MAGIC = "LCHEADST";

/**
 * Serializes a head state into the bytes of a head-state file:
 *
 *     0   "LCHEADST"                     magic
 *     8   u32 version, u32 header bytes  little-endian
 *     16  header JSON (HeadStateHeader), space-padded to a multiple of 8
 *         u32[K] stored coordinates, ascending, zero-padded to a multiple of 8
 *         f64[K * heads] z, [coordinate][head]
 *         f64[K * heads] n
 *         f64[K * heads] averaged weights, only under info.averaging (version 2)
 *         f64[heads * 5] progressive sums over all rows
 *         f64[slices * heads * 5] progressive sums per slice
 *
 * Only coordinates with some non-zero z or n are stored (a coordinate that never
 * had a gradient is all zero), so a 2^20-bucket hashed space costs what the data
 * touched, and every number is stored bit for bit, so a resumed run continues
 * exactly.
 *
 * @example
 * await writeFileAtomic("runs/demo/heads.state", encodeHeadState(state));
 */
export function encodeHeadState(state: HeadState): Uint8Array {
  if (!LITTLE_ENDIAN) {
    throw new LeafcastError("heads", [
      {
        code: "byte_order",
        message: "head-state files expected a little-endian host, found big-endian",
      },
    ]);
  }
  const { z, n, headCount: heads, coordinateCount } = state;
  const stats = state.progressive;
  let stored = 0;
  for (let c = 0; c < coordinateCount; c++) if (touched(z, n, c, heads)) stored++;
  const header: HeadStateHeader = {
    format: HEAD_STATE_FORMAT,
    version: HEAD_STATE_VERSION,
    byteOrder: "little-endian",
    info: state.info,
    rowCount: state.rowCount,
    firstTimestamp: state.firstTimestamp,
    lastTimestamp: state.lastTimestamp,
    sliceIndexes: stats.sliceIndexes,
    storedCoordinates: stored,
    statFields: STAT_FIELDS,
    ...(state.average === null ? {} : { averageMass: state.averageMass }),
  };
  const json = new TextEncoder().encode(JSON.stringify(header));
  const headerBytes = align8(16 + json.length) - 16;
  const coordinateBytes = align8(stored * 4);
  const valueCount = stored * heads;
  const { average } = state;
  const sections = average === null ? 2 : 3;
  const sliceValues = stats.sliceCount * heads * STAT_FIELDS;
  const total =
    16 +
    headerBytes +
    coordinateBytes +
    8 * (sections * valueCount + heads * STAT_FIELDS + sliceValues);
  const bytes = new Uint8Array(total);
  bytes.set(new TextEncoder().encode(HEAD_STATE_MAGIC), 0);
  const view = new DataView(bytes.buffer);
  view.setUint32(8, HEAD_STATE_VERSION, true);
  view.setUint32(12, headerBytes, true);
  bytes.set(json, 16);
  bytes.fill(0x20, 16 + json.length, 16 + headerBytes);

  let at = 16 + headerBytes;
  const coordinates = new Uint32Array(bytes.buffer, at, stored);
  at += coordinateBytes;
  const zOut = new Float64Array(bytes.buffer, at, valueCount);
  at += 8 * valueCount;
  const nOut = new Float64Array(bytes.buffer, at, valueCount);
  at += 8 * valueCount;
  const averageOut = average === null ? null : new Float64Array(bytes.buffer, at, valueCount);
  if (average !== null) at += 8 * valueCount;
  // A coordinate whose z and n are zero never had a gradient, so its average is zero too.
  for (let c = 0, k = 0; c < coordinateCount; c++) {
    if (!touched(z, n, c, heads)) continue;
    coordinates[k] = c;
    zOut.set(z.subarray(c * heads, (c + 1) * heads), k * heads);
    nOut.set(n.subarray(c * heads, (c + 1) * heads), k * heads);
    if (average !== null && averageOut !== null) {
      averageOut.set(average.subarray(c * heads, (c + 1) * heads), k * heads);
    }
    k++;
  }
  new Float64Array(bytes.buffer, at, heads * STAT_FIELDS).set(stats.overall);
  at += 8 * heads * STAT_FIELDS;
  new Float64Array(bytes.buffer, at, sliceValues).set(stats.sliceStats.subarray(0, sliceValues));
  return bytes;
}

function touched(z: Float64Array, n: Float64Array, c: number, heads: number): boolean {
  for (let i = c * heads, end = i + heads; i < end; i++) {
    if (z[i] !== 0 || n[i] !== 0) return true;
  }
  return false;
}

function align8(bytes: number): number {
  return Math.ceil(bytes / 8) * 8;
}
