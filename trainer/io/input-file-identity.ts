import { stat } from "node:fs/promises";
import { basename } from "node:path";
import { LeafcastError } from "../errors.js";
import type { JsonSchema } from "../../scorer/json-schema-check.js";

/** How a checkpoint recognises an input file without reading it again: name, size and time of change. */
export interface InputFileIdentity {
  readonly name: string;
  readonly bytes: number;
  readonly modifiedMs: number;
}

/** What an InputFileIdentity looks like in a checkpoint file (checked with checkJsonSchema). */
export const inputFileIdentitySchema: JsonSchema = {
  type: "object",
  required: ["name", "bytes", "modifiedMs"],
  properties: {
    name: { type: "string" },
    bytes: { type: "number" },
    modifiedMs: { type: "number" },
  },
};

/**
 * The identities of the input files of a run, in order. A file that cannot be
 * examined is left to the reader, which says why it cannot be read.
 *
 * @example
 * await inputFileIdentities(["day-01.csv"]); // [{ name: "day-01.csv", bytes: 81234, modifiedMs: 1764640000000 }]
 */
export async function inputFileIdentities(paths: readonly string[]): Promise<InputFileIdentity[]> {
  return Promise.all(
    paths.map(async (path) => {
      try {
        const info = await stat(path);
        return { name: basename(path), bytes: info.size, modifiedMs: Math.trunc(info.mtimeMs) };
      } catch {
        return { name: basename(path), bytes: -1, modifiedMs: -1 };
      }
    }),
  );
}

/**
 * Refuses a checkpoint whose input files are not these: another count, name,
 * size or time of change (the rows it skipped would not be the rows it read).
 * `checkpoint` labels the error.
 *
 * @example
 * checkInputFiles(saved.files, await inputFileIdentities(paths), "forests.json.checkpoint");
 */
export function checkInputFiles(
  saved: readonly InputFileIdentity[],
  found: readonly InputFileIdentity[],
  checkpoint: string,
): void {
  const describe = (list: readonly InputFileIdentity[]): string =>
    list.map((f) => `${f.name} (${f.bytes} bytes, changed ${stamp(f.modifiedMs)})`).join(", ");
  const same =
    saved.length === found.length &&
    saved.every(
      (s, i) =>
        s.name === found[i].name &&
        s.bytes === found[i].bytes &&
        s.modifiedMs === found[i].modifiedMs,
    );
  if (same) return;
  throw new LeafcastError("checkpoint", [
    {
      code: "inputs_changed",
      message:
        `cannot resume: the checkpoint was made from ${describe(saved) || "no files"}, found ${describe(found) || "no files"}; ` +
        "remove the checkpoint (or pass --restart) to start over",
      file: checkpoint,
    },
  ]);
}

function stamp(ms: number): string {
  return ms < 0 ? "never (missing)" : new Date(ms).toISOString();
}
