import { readFile } from "node:fs/promises";
import { LeafcastError } from "../errors.js";
import { decodeHeadState } from "./decode-head-state.js";
import type { HeadState } from "./head-state.js";

/**
 * Reads a head-state file written by saveHeadState.
 *
 * @example
 * const state = await loadHeadState("runs/demo/heads.state");
 * state.rowCount; // rows learned so far
 */
export async function loadHeadState(path: string): Promise<HeadState> {
  let bytes: Uint8Array;
  try {
    bytes = await readFile(path);
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    throw new LeafcastError("heads", [
      { code: "unreadable", message: `cannot read head state: ${reason}`, file: path },
    ]);
  }
  return decodeHeadState(bytes, path);
}
