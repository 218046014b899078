import { readdir, stat } from "node:fs/promises";
import { join } from "node:path";
import { detectDataFormat } from "../data/detect-data-format.js";
import { LeafcastError } from "../errors.js";

/**
 * The day files to replay, in time order: paths given one by one are kept as
 * given; a directory stands for the data files in it (names ending in a known
 * data extension, hidden files skipped), sorted by name with numbers compared as
 * numbers, so "day-9" comes before "day-10".
 *
 * @example
 * await listDayFiles(["runs/demo/data"]); // ["runs/demo/data/day-01.csv", ..., "runs/demo/data/day-42.csv"]
 */
export async function listDayFiles(paths: readonly string[]): Promise<string[]> {
  const files: string[] = [];
  for (const path of paths) {
    const info = await stat(path).catch(() => null);
    if (info === null) {
      throw new LeafcastError("study", [
        {
          code: "no_such_file",
          message: "expected a data file or a directory of them, found nothing",
          file: path,
        },
      ]);
    }
    if (!info.isDirectory()) {
      files.push(path);
      continue;
    }
    const names = (await readdir(path))
      .filter((name) => !name.startsWith(".") && isDataFile(name))
      .sort((a, b) => a.localeCompare(b, "en", { numeric: true }));
    if (names.length === 0) {
      throw new LeafcastError("study", [
        {
          code: "no_data_files",
          message:
            "expected data files (.csv, .ndjson, .parquet, .arrow) in the directory, found none",
          file: path,
        },
      ]);
    }
    files.push(...names.map((name) => join(path, name)));
  }
  return files;
}

function isDataFile(name: string): boolean {
  try {
    detectDataFormat(name);
    return true;
  } catch {
    return false;
  }
}
