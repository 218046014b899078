import { LeafcastError, type Issue } from "../errors.js";
import { checkInputFiles } from "../io/input-file-identity.js";
import { readCheckpointBytes } from "../io/read-checkpoint-bytes.js";
import { decodeHeadCheckpoint } from "./decode-head-checkpoint.js";
import type { HeadCheckpoint, HeadCheckpointInputs } from "./head-checkpoint.js";

/**
 * The head checkpoint at `path` when there is one, refused (LeafcastError from
 * "checkpoint") unless it was made from these inputs: a resumed run must skip
 * exactly the rows the checkpoint's state has learned from. null: start afresh.
 *
 * @example
 * const resume = await openHeadCheckpoint("heads.state.checkpoint", inputs);
 * resume?.position; // { file: 0, rows: 65536 }
 */
export async function openHeadCheckpoint(
  path: string,
  inputs: HeadCheckpointInputs,
): Promise<HeadCheckpoint | null> {
  const bytes = await readCheckpointBytes(path);
  if (bytes === null) return null;
  const checkpoint = decodeHeadCheckpoint(bytes, path);
  const saved = checkpoint.inputs;
  checkInputFiles(saved.files, inputs.files, path);
  const issues: Issue[] = [];
  const compare = (code: string, what: string, expected: unknown, found: unknown): void => {
    if (JSON.stringify(expected) === JSON.stringify(found)) return;
    issues.push({
      code,
      message: `cannot resume: ${what} expected ${JSON.stringify(expected)} (as when the checkpoint was made), found ${JSON.stringify(found)}; remove the checkpoint (or pass --restart) to start over`,
      file: path,
    });
  };
  compare("start_changed", "the starting heads (hash)", saved.start, inputs.start);
  compare("batch_rows_changed", "batchRows", saved.batchRows, inputs.batchRows);
  compare("bad_rows_changed", "the bad-row policy", saved.badRows, inputs.badRows);
  const { file, rows } = checkpoint.position;
  if (file >= inputs.files.length || checkpoint.reads.length !== file) {
    compare("bad_position", "a position inside the files", inputs.files.length, file);
  }
  if (!Number.isSafeInteger(rows)) compare("bad_position", "a row count", "safe integer", rows);
  if (issues.length > 0) throw new LeafcastError("checkpoint", issues);
  return checkpoint;
}
