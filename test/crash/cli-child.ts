import { spawn } from "node:child_process";
import { BUILT_CLI } from "./ensure-built-cli.js";

/** How a child run of the CLI ended. */
export interface ChildEnd {
  /** Exit code, or null when killed. */
  readonly code: number | null;
  readonly killed: boolean;
  readonly stderr: string;
  readonly stdout: string;
  /** Lines written to stderr that match the pattern (progress or checkpoint lines). */
  readonly lines: number;
  readonly ms: number;
}

/**
 * When to SIGKILL a child: a delay after its n-th stderr line that matches
 * `pattern` (progress and checkpoint lines), or a delay after it starts.
 */
export type KillPlan =
  { readonly afterLine: number; readonly delayMs: number } | { readonly afterMs: number } | null;

/**
 * Runs the built CLI in a child process with `args`; with a plan, sends SIGKILL
 * (no chance to clean up, as when a machine loses power or an operator kills
 * it) at the planned moment, unless the run ends first.
 */
export function runCliChild(
  args: readonly string[],
  plan: KillPlan,
  pattern: RegExp = /./,
): Promise<ChildEnd> {
  const started = performance.now();
  const child = spawn(process.execPath, [BUILT_CLI, ...args], {
    stdio: ["ignore", "pipe", "pipe"],
  });
  let stderr = "";
  let stdout = "";
  let lines = 0;
  let partial = "";
  let timer: NodeJS.Timeout | null = null;
  const kill = (): void => {
    if (child.exitCode === null && child.signalCode === null) child.kill("SIGKILL");
  };
  if (plan !== null && "afterMs" in plan) timer = setTimeout(kill, plan.afterMs);
  child.stdout.on("data", (chunk: Buffer) => {
    stdout += chunk.toString();
  });
  child.stderr.on("data", (chunk: Buffer) => {
    const text = chunk.toString();
    stderr += text;
    const before = lines;
    const parts = (partial + text).split("\n");
    partial = parts.pop() ?? "";
    for (const line of parts) if (pattern.test(line)) lines++;
    if (
      plan !== null &&
      "afterLine" in plan &&
      before < plan.afterLine &&
      lines >= plan.afterLine
    ) {
      timer = setTimeout(kill, plan.delayMs);
    }
  });
  return new Promise((resolve, reject) => {
    child.on("error", reject);
    child.on("close", (code, signal) => {
      if (timer !== null) clearTimeout(timer);
      const killed = signal === "SIGKILL";
      resolve({ code, killed, stderr, stdout, lines, ms: performance.now() - started });
    });
  });
}
