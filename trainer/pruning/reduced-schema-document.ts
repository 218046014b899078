import { checkJsonSchema, type JsonSchema } from "../../scorer/json-schema-check.js";
import { LeafcastError, type Issue } from "../errors.js";
import { datasetSchemaDocument, type DatasetSchema } from "../schema/dataset-schema.generated.js";
import { resolveDatasetSchema, type ResolvedSchema } from "../schema/load-dataset-schema.js";

/**
 * The dataset schema document with the dropped feature columns set to role
 * "ignore" (read past) and everything else unchanged: column order, names,
 * descriptions, missing-value texts. Checked against schemas/dataset.schema.json
 * and resolved again before it is returned, so it can be written as is. Only
 * numeric and categorical columns can be dropped; anything else is refused with
 * every problem named.
 *
 * @example
 * const doc = reducedSchemaDocument(schema, ["noise_a", "author_post_rate"]);
 * doc.columns.find((c) => c.name === "noise_a")?.role; // "ignore"
 */
export function reducedSchemaDocument(
  schema: ResolvedSchema,
  dropped: readonly string[],
): DatasetSchema {
  const issues: Issue[] = [];
  const drop = new Set(dropped);
  for (const name of drop) {
    const column = schema.byName.get(name);
    if (column === undefined || (column.role !== "numeric" && column.role !== "categorical")) {
      issues.push({
        code: "not_a_feature",
        message: `expected "${name}" to be a numeric or categorical column of schema "${schema.name}", found ${column === undefined ? "no such column" : `role "${column.role}"`}`,
      });
    }
  }
  if (issues.length > 0) throw new LeafcastError("pruning", issues);
  // A structured copy, so the caller's document is never changed.
  const document = structuredClone(schema.document);
  const columns = document.columns.map((spec) =>
    drop.has(spec.name) ? { ...spec, role: "ignore" as const } : spec,
  );
  const reduced: DatasetSchema = { ...document, columns };
  for (const issue of checkJsonSchema(datasetSchemaDocument as JsonSchema, reduced, {
    exactIntegers: true,
  })) {
    issues.push({
      code: issue.code,
      message: `reduced schema ${issue.path || "/"}: ${issue.message}`,
    });
  }
  if (issues.length > 0) throw new LeafcastError("pruning", issues);
  // The semantic checks too (one timestamp, an outcome left, ...).
  resolveDatasetSchema(reduced, "<reduced schema>");
  return reduced;
}
