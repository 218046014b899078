import { isUtf8 } from "node:buffer";
import { readFile } from "node:fs/promises";
import { LeafcastError } from "../errors.js";

/**
 * Reads and parses a JSON file, turning syntax errors into a LeafcastError that
 * names the file and the line and column of the problem. The file must be UTF-8
 * (RFC 8259): invalid bytes are refused rather than decoded to U+FFFD, which
 * would silently change a column name. A leading byte order mark is skipped,
 * as the CSV and NDJSON readers do (RFC 8259 lets a parser ignore it).
 *
 * @example
 * const doc = await parseJsonFile("plotline.schema.json", "schema");
 */
export async function parseJsonFile(path: string, source: string): Promise<unknown> {
  let bytes: Buffer;
  try {
    bytes = await readFile(path);
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    throw new LeafcastError(source, [
      { code: "unreadable", message: `cannot read file: ${reason}`, file: path },
    ]);
  }
  if (!isUtf8(bytes)) {
    const at = firstInvalidUtf8(bytes);
    throw new LeafcastError(source, [
      {
        code: "invalid_utf8",
        message: `expected UTF-8 text, found an invalid byte 0x${(bytes[at] ?? 0).toString(16).padStart(2, "0")} at byte ${at}`,
        file: path,
      },
    ]);
  }
  let text: string;
  try {
    text = bytes.toString("utf8");
  } catch (error) {
    // A file past the longest string V8 can hold.
    const reason = error instanceof Error ? error.message : String(error);
    throw new LeafcastError(source, [
      { code: "unreadable", message: `cannot read file: ${reason}`, file: path },
    ]);
  }
  return parseJsonText(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text, path, source);
}

/** Parses JSON text; `file` only labels errors. */
export function parseJsonText(text: string, file: string, source: string): unknown {
  try {
    return JSON.parse(text) as unknown;
  } catch (error) {
    // SyntaxError, or RangeError should a future engine's parser recurse on deep nesting.
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

/** The offset of the first byte sequence that breaks UTF-8 (called only when there is one). */
function firstInvalidUtf8(bytes: Buffer): number {
  let i = 0;
  while (i < bytes.length) {
    const c = bytes[i];
    const length = c < 0x80 ? 1 : c < 0xc2 ? 0 : c < 0xe0 ? 2 : c < 0xf0 ? 3 : c < 0xf5 ? 4 : 0;
    // isUtf8 on the one sequence also refuses overlong forms, surrogates and cut-off ends.
    if (length === 0 || !isUtf8(bytes.subarray(i, i + length))) return i;
    i += length;
  }
  return Math.max(0, bytes.length - 1);
}
