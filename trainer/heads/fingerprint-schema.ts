import { createHash } from "node:crypto";
import type { ResolvedSchema } from "../schema/load-dataset-schema.js";

/**
 * A fingerprint of what a dataset schema says about the data: each column's
 * name, role, time unit and outcome link, in order. Descriptions and missing-value
 * spellings do not change it; renaming, re-roling or reordering columns does.
 *
 * @example
 * fingerprintSchema(await loadDatasetSchema("datasets/plotline.schema.json")); // "sha256:..."
 */
export function fingerprintSchema(schema: ResolvedSchema): string {
  const columns = schema.columns.map((c) => [c.name, c.role, c.timeUnit, c.outcome]);
  return `sha256:${createHash("sha256").update(JSON.stringify(columns)).digest("hex")}`;
}
