import { vi } from "vitest";
import { runCli } from "../../trainer/cli/main.js";

/** What one in-process CLI run returned and printed. */
export interface CliRun {
  readonly code: number;
  readonly out: string;
  readonly err: string;
}

/**
 * Runs the CLI in-process, returning its exit code and what it wrote to stdout
 * and stderr (captured, not shown).
 *
 * @example
 * const { code, err } = await runCliCaptured(["inspect", "missing.csv", "--schema", "s.json"]);
 */
export async function runCliCaptured(args: readonly string[]): Promise<CliRun> {
  let out = "";
  let err = "";
  const stdout = vi.spyOn(process.stdout, "write").mockImplementation((chunk) => {
    out += String(chunk);
    return true;
  });
  const stderr = vi.spyOn(process.stderr, "write").mockImplementation((chunk) => {
    err += String(chunk);
    return true;
  });
  try {
    return { code: await runCli(args), out, err };
  } finally {
    stdout.mockRestore();
    stderr.mockRestore();
  }
}
