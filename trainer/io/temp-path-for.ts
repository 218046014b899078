import { basename, dirname, join } from "node:path";

/** Tells apart the temporary files of two writes to one path in the same millisecond. */
let serial = 0;

/**
 * The temporary sibling a write to `path` fills before it is renamed into place:
 * `.<name>.<pid>.<ms>.<serial>.tmp` in the same directory (a rename is atomic
 * only within one file system). The process id in the name lets a later write
 * tell a temporary file of a killed process from one still being written
 * (see removeStaleTemps).
 *
 * @example
 * tempPathFor("runs/demo/forests.json"); // "runs/demo/.forests.json.4242.1764640000000.0.tmp"
 */
export function tempPathFor(path: string): string {
  return join(dirname(path), `.${basename(path)}.${process.pid}.${Date.now()}.${serial++}.tmp`);
}
