import { createHash } from "node:crypto";
import { inputFileIdentities } from "../io/input-file-identity.js";
import { encodeHeadState } from "./encode-head-state.js";
import type { HeadCheckpointInputs } from "./head-checkpoint.js";
import type { HeadState } from "./head-state.js";

/**
 * What a head checkpoint of this run records about its inputs (and what a
 * checkpoint found on disk must match): the files, a hash of the starting
 * state, the batch size and the bad-row policy. Call before learning: the
 * starting state is trained in place.
 *
 * @example
 * const inputs = await headCheckpointInputs(["day-08.csv"], saved, 65536, "fail");
 */
export async function headCheckpointInputs(
  paths: readonly string[],
  start: HeadState | null,
  batchRows: number,
  badRows: "fail" | "skip",
): Promise<HeadCheckpointInputs> {
  return {
    files: await inputFileIdentities(paths),
    start:
      start === null
        ? null
        : `sha256:${createHash("sha256").update(encodeHeadState(start)).digest("hex")}`,
    batchRows,
    badRows,
  };
}
