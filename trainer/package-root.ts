import { existsSync, readFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

/**
 * The folder that holds Leafcast's package.json, found from this file whether it
 * runs as TypeScript source or compiled under dist/, so bundled files such as
 * datasets/plotline.schema.json can be found from any working directory.
 *
 * @example
 * join(packageRoot(), "datasets", "plotline.schema.json");
 */
export function packageRoot(): string {
  let dir = dirname(fileURLToPath(import.meta.url));
  while (!isLeafcastRoot(dir)) {
    const parent = dirname(dir);
    if (parent === dir) throw new Error(`leafcast: no package.json of leafcast above ${dir}`);
    dir = parent;
  }
  return dir;
}

/** The built-in Plotline dataset schema. */
export function plotlineSchemaPath(): string {
  return join(packageRoot(), "datasets", "plotline.schema.json");
}

function isLeafcastRoot(dir: string): boolean {
  const file = join(dir, "package.json");
  if (!existsSync(file)) return false;
  try {
    return (JSON.parse(readFileSync(file, "utf8")) as { name?: unknown }).name === "leafcast";
  } catch {
    return false;
  }
}
