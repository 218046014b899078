import { writeFileAtomic } from "../io/write-file-atomic.js";
import type { ResolvedSchema } from "../schema/load-dataset-schema.js";
import { reducedSchemaDocument } from "./reduced-schema-document.js";

/**
 * Writes the dataset schema with the dropped columns set to role "ignore"
 * (see reducedSchemaDocument, which validates it first), as indented JSON, in
 * one atomic step: a reader sees the old file or the complete new one.
 *
 * @example
 * await writeReducedSchema("runs/may/plotline.pruned.schema.json", schema, result.dropped);
 */
export async function writeReducedSchema(
  path: string,
  schema: ResolvedSchema,
  dropped: readonly string[],
): Promise<void> {
  const document = reducedSchemaDocument(schema, dropped);
  await writeFileAtomic(path, `${JSON.stringify(document, null, 2)}\n`);
}
