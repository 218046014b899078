import { writeFileAtomic } from "../io/write-file-atomic.js";
import { encodeHeadState } from "./encode-head-state.js";
import type { HeadState } from "./head-state.js";

/**
 * Writes a head state to `path` atomically: a reader, or a run killed mid-write,
 * sees the previous complete file or the new one.
 *
 * @example
 * await saveHeadState("runs/demo/heads.state", state);
 */
export async function saveHeadState(path: string, state: HeadState): Promise<void> {
  await writeFileAtomic(path, encodeHeadState(state));
}
