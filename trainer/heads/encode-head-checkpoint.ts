import { encodeHeadState } from "./encode-head-state.js";
import {
  HEAD_CHECKPOINT_MAGIC,
  HEAD_CHECKPOINT_VERSION,
  type HeadCheckpoint,
} from "./head-checkpoint.js";

/**
 * Serializes a head checkpoint:
 *
 *     0   "LCHEADCK"                 magic
 *     8   u32 version, u32 header bytes   little-endian
 *     16  header JSON { inputs, position, reads }, space-padded to a multiple of 8
 *         the head state, exactly as a head-state file holds it (encodeHeadState)
 *
 * The state keeps every number bit for bit, so learning resumed from it gives
 * the heads of an uninterrupted run.
 *
 * @example
 * await writeFileAtomic("heads.state.checkpoint", encodeHeadCheckpoint({ inputs, position: { file: 0, rows: 65536 }, reads: [], state }));
 */
export function encodeHeadCheckpoint(checkpoint: HeadCheckpoint): Uint8Array {
  const header = {
    inputs: checkpoint.inputs,
    position: checkpoint.position,
    reads: checkpoint.reads,
  };
  const json = new TextEncoder().encode(JSON.stringify(header));
  const headerBytes = Math.ceil(json.length / 8) * 8;
  const state = encodeHeadState(checkpoint.state);
  const bytes = new Uint8Array(16 + headerBytes + state.length);
  bytes.set(new TextEncoder().encode(HEAD_CHECKPOINT_MAGIC), 0);
  const view = new DataView(bytes.buffer);
  view.setUint32(8, HEAD_CHECKPOINT_VERSION, true);
  view.setUint32(12, headerBytes, true);
  bytes.set(json, 16);
  bytes.fill(0x20, 16 + json.length, 16 + headerBytes);
  bytes.set(state, 16 + headerBytes);
  return bytes;
}
