import { readFile } from "node:fs/promises";
import { LeafcastError } from "../errors.js";

/**
 * Reads and parses a JSON file, turning syntax errors into a LeafcastError that
 * names the file and the line and column of the problem.
 *
 * @example
 * const doc = await parseJsonFile("plotline.schema.json", "schema");
 */
export async function parseJsonFile(path: string, source: string): Promise<unknown> {
  let text: string;
  try {
    text = await readFile(path, "utf8");
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    throw new LeafcastError(source, [
      { code: "unreadable", message: `cannot read file: ${reason}`, file: path },
    ]);
  }
  return parseJsonText(text, path, source);
}

/** Parses JSON text; `file` only labels errors. */
export function parseJsonText(text: string, file: string, source: string): unknown {
  try {
    return JSON.parse(text) as unknown;
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    const at = /position (\d+)/.exec(reason);
    let where = "";
    if (at?.[1] !== undefined) {
      const offset = Number(at[1]);
      const before = text.slice(0, offset);
      const line = before.split("\n").length;
      const column = offset - before.lastIndexOf("\n");
      where = ` at line ${line}, column ${column}`;
    }
    throw new LeafcastError(source, [
      {
        code: "invalid_json",
        message: `expected valid JSON${where}, found a syntax error: ${reason}`,
        file,
      },
    ]);
  }
}
