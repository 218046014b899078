import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync, readdirSync, rmSync, statSync } from "node:fs";
import { join } from "node:path";

/** The built command line (what `npm run build` writes). */
export const BUILT_CLI = "dist/trainer/cli/main.js";

const LOCK = "dist/.test-build-lock";

/**
 * Makes sure dist/ holds a build of the current sources: `npm test` builds
 * first, but a test file run on its own may find dist/ older than the sources.
 * Rebuilds (tsc, as `npm run build` does) only then, one test file at a time:
 * tsc writes files in place, and a child started meanwhile would load half of one.
 */
export async function ensureBuiltCli(): Promise<void> {
  for (let waited = 0; ; waited += 200) {
    if (isFresh()) return;
    try {
      mkdirSync(LOCK, { recursive: false });
      break;
    } catch {
      // Another test file is building: wait for it, then look again.
      if (waited > 180_000) rmSync(LOCK, { recursive: true, force: true });
      await new Promise((resolve) => setTimeout(resolve, 200));
    }
  }
  try {
    if (isFresh()) return;
    const built = spawnSync(
      process.execPath,
      ["node_modules/typescript/bin/tsc", "-p", "tsconfig.build.json"],
      { encoding: "utf8" },
    );
    if (built.status !== 0) {
      throw new Error(`building the CLI failed (tsc exit ${built.status}): ${built.stdout}`);
    }
    if (!existsSync(BUILT_CLI)) throw new Error(`expected ${BUILT_CLI} after building, found none`);
  } finally {
    rmSync(LOCK, { recursive: true, force: true });
  }
}

function isFresh(): boolean {
  const built = existsSync(BUILT_CLI) ? statSync(BUILT_CLI).mtimeMs : -1;
  return built >= newestSource(["trainer", "scorer", "datasets"]);
}

function newestSource(dirs: readonly string[]): number {
  let newest = 0;
  const visit = (dir: string): void => {
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const path = join(dir, entry.name);
      if (entry.isDirectory()) visit(path);
      else if (entry.name.endsWith(".ts")) newest = Math.max(newest, statSync(path).mtimeMs);
    }
  };
  for (const dir of dirs) visit(dir);
  return newest;
}
