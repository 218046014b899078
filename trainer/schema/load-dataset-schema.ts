import { checkJsonSchema, type JsonSchema } from "../../scorer/json-schema-check.js";
import { LeafcastError, type Issue } from "../errors.js";
import {
  datasetSchemaDocument,
  type ColumnSpec,
  type DatasetSchema,
} from "./dataset-schema.generated.js";
import { parseJsonFile } from "./parse-json-file.js";

export type ColumnRole = ColumnSpec["role"];

/** A column of the dataset schema with every default filled in. */
export interface ResolvedColumn {
  readonly name: string;
  readonly role: ColumnRole;
  readonly required: boolean;
  /** Cell texts read as missing. */
  readonly missing: ReadonlySet<string>;
  readonly allowMissing: boolean;
  readonly timeUnit: "s" | "ms" | "iso";
  /** For role "true_probability": the outcome it belongs to. */
  readonly outcome: string | null;
}

/** A validated dataset schema, with the columns grouped by role. */
export interface ResolvedSchema {
  readonly name: string;
  readonly columns: readonly ResolvedColumn[];
  readonly byName: ReadonlyMap<string, ResolvedColumn>;
  readonly numeric: readonly string[];
  readonly categorical: readonly string[];
  readonly outcomes: readonly string[];
  readonly weight: string | null;
  readonly timestamp: string | null;
  readonly groups: readonly string[];
  /** Outcome name to its true-probability column. */
  readonly trueProbability: ReadonlyMap<string, string>;
  /** The document it came from, for writing it out again (e.g. a pruned schema). */
  readonly document: DatasetSchema;
}

/**
 * Loads, validates and resolves a dataset schema file.
 *
 * @example
 * const schema = await loadDatasetSchema("datasets/plotline.schema.json");
 * schema.outcomes; // ["open", "react", "reply", "save", "reshare", "hide"]
 */
export async function loadDatasetSchema(path: string): Promise<ResolvedSchema> {
  return resolveDatasetSchema(await parseJsonFile(path, "schema"), path);
}

/** Validates a parsed schema document and fills in defaults; `file` labels errors. */
export function resolveDatasetSchema(document: unknown, file = "<schema>"): ResolvedSchema {
  const issues: Issue[] = checkJsonSchema(datasetSchemaDocument as JsonSchema, document, {
    exactIntegers: true,
  }).map((issue) => ({
    code: issue.code,
    message: `${issue.path || "/"}: ${issue.message}`,
    file,
  }));
  if (issues.length > 0) throw new LeafcastError("schema", issues);
  const doc = document as DatasetSchema;
  const defaultMissing = new Set(doc.missing ?? [""]);
  const columns = doc.columns.map((spec): ResolvedColumn => ({
    name: spec.name,
    role: spec.role,
    required: spec.required ?? true,
    missing: spec.missing !== undefined ? new Set(spec.missing) : defaultMissing,
    allowMissing: spec.allowMissing ?? (spec.role === "numeric" || spec.role === "categorical"),
    timeUnit: spec.timeUnit ?? "s",
    outcome: spec.outcome ?? null,
  }));
  const byName = new Map<string, ResolvedColumn>();
  for (const column of columns) {
    if (byName.has(column.name)) {
      issues.push({
        code: "duplicate_column",
        message: `column "${column.name}" is declared twice`,
        file,
      });
    }
    byName.set(column.name, column);
  }
  const named = (role: ColumnRole): string[] =>
    columns.filter((c) => c.role === role).map((c) => c.name);
  const single = (role: ColumnRole): string | null => {
    const list = named(role);
    if (list.length > 1) {
      issues.push({
        code: "duplicate_role",
        message: `expected at most one ${role} column, found ${list.length} (${list.join(", ")})`,
        file,
      });
    }
    return list[0] ?? null;
  };
  const trueProbability = new Map<string, string>();
  for (const column of columns) {
    if (column.role !== "true_probability") continue;
    const target = column.outcome === null ? undefined : byName.get(column.outcome);
    if (target === undefined || target.role !== "outcome") {
      issues.push({
        code: "unknown_outcome",
        message: `column "${column.name}" expected "outcome" to name an outcome column, found ${JSON.stringify(column.outcome)}`,
        file,
      });
    } else {
      trueProbability.set(target.name, column.name);
    }
  }
  const resolved: ResolvedSchema = {
    name: doc.name,
    columns,
    byName,
    numeric: named("numeric"),
    categorical: named("categorical"),
    outcomes: named("outcome"),
    weight: single("weight"),
    timestamp: single("timestamp"),
    groups: named("group"),
    trueProbability,
    document: doc,
  };
  if (resolved.outcomes.length === 0) {
    issues.push({
      code: "no_outcome",
      message: "expected at least one outcome column, found none",
      file,
    });
  }
  if (issues.length > 0) throw new LeafcastError("schema", issues);
  return resolved;
}
