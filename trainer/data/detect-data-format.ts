import { LeafcastError } from "../errors.js";

/** The file formats Leafcast reads. */
export type DataFormat = "csv" | "ndjson" | "parquet" | "arrow";

const byExtension: ReadonlyMap<string, DataFormat> = new Map([
  [".csv", "csv"],
  [".ndjson", "ndjson"],
  [".jsonl", "ndjson"],
  [".parquet", "parquet"],
  [".arrow", "arrow"],
  [".arrows", "arrow"],
  [".feather", "arrow"],
  [".ipc", "arrow"],
]);

/**
 * The format of a data file, from its extension (case-insensitive), so a
 * caller never has to say it for the usual names.
 *
 * @example
 * detectDataFormat("logs/impressions.JSONL"); // "ndjson"
 */
export function detectDataFormat(path: string): DataFormat {
  const dot = path.lastIndexOf(".");
  const slash = Math.max(path.lastIndexOf("/"), path.lastIndexOf("\\"));
  const extension = dot > slash ? path.slice(dot).toLowerCase() : "";
  const format = byExtension.get(extension);
  if (format === undefined) {
    throw new LeafcastError("data", [
      {
        code: "unknown_format",
        message: `expected a file name ending in ${[...byExtension.keys()].join(", ")} (or the format option), found ${extension === "" ? "no extension" : JSON.stringify(extension)}`,
        file: path,
      },
    ]);
  }
  return format;
}
