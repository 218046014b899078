import type { ReadStats } from "../data/read-types.js";
import type { InputFileIdentity } from "../io/input-file-identity.js";
import type { HeadState } from "./head-state.js";

/** First 8 bytes of a head-learning checkpoint file, and its version. */
export const HEAD_CHECKPOINT_MAGIC = "LCHEADCK";
export const HEAD_CHECKPOINT_VERSION = 1;

/**
 * What a head checkpoint was made from. A run resumes from it only over the
 * same files (name, size, time of change), from the same starting heads, read
 * in the same batches with the same bad-row policy; the state inside carries
 * the trees, schema and settings it was learned under (checkResume).
 */
export interface HeadCheckpointInputs {
  readonly files: readonly InputFileIdentity[];
  /** SHA-256 of the starting head-state file's bytes (update-heads); null for fresh heads. */
  readonly start: string | null;
  readonly batchRows: number;
  readonly badRows: "fail" | "skip";
}

/**
 * A head-learning checkpoint: the state after every row read so far, and where
 * in the input those rows end (taken at a batch boundary, after every head has
 * trained on every row before it).
 *
 * @example
 * await writeFileAtomic(`${out}.checkpoint`, encodeHeadCheckpoint(checkpoint));
 */
export interface HeadCheckpoint {
  readonly inputs: HeadCheckpointInputs;
  /** The file being read (0-based) and the rows of it already learned from. */
  readonly position: { readonly file: number; readonly rows: number };
  /** Read statistics of the files before position.file (they are not read again). */
  readonly reads: readonly ReadStats[];
  readonly state: HeadState;
}
