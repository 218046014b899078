import { accessSync, constants, mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";

/**
 * A fresh directory for a fuzz run's small files, in memory (/dev/shm) where the
 * system has it: thousands of cases each write a file and fsync a rejects file.
 */
export function scratchDir(prefix: string): string {
  let base = tmpdir();
  try {
    accessSync("/dev/shm", constants.W_OK);
    base = "/dev/shm";
  } catch {
    // No shared-memory file system (macOS, Windows): the usual temp directory.
  }
  return mkdtempSync(join(base, prefix));
}
