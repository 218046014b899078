import { accessSync, constants, mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll } from "vitest";

/** Directories made for the test file that imported this module (vitest loads it afresh per file). */
const made: string[] = [];

// Removed when the file's tests end, even when a test failed or a caller forgot:
// fuzz runs made thousands of temporary directories that stayed behind.
afterAll(() => {
  for (const dir of made.splice(0)) rmSync(dir, { recursive: true, force: true });
});

/**
 * A fresh directory for a fuzz run's small files, in memory (/dev/shm) where the
 * system has it: thousands of cases each write a file and fsync a rejects file.
 * Removed with its contents after the calling test file's last test.
 */
export function scratchDir(prefix: string): string {
  let base = tmpdir();
  try {
    accessSync("/dev/shm", constants.W_OK);
    base = "/dev/shm";
  } catch {
    // No shared-memory file system (macOS, Windows): the usual temp directory.
  }
  const dir = mkdtempSync(join(base, prefix));
  made.push(dir);
  return dir;
}
