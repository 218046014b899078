// Generated from schemas/dataset.schema.json by schemas/generate.ts: do not edit; run `npm run schemas`.

export const datasetSchemaDocument = {
  "$schema": "https://json-schema.org/draft/2020-12/schema",
  "$id": "https://leafcast.dev/schemas/dataset.schema.json",
  "title": "DatasetSchema",
  "description": "Declares what each column of an impression log means to Leafcast. Columns not listed are ignored.",
  "type": "object",
  "additionalProperties": false,
  "required": [
    "name",
    "columns"
  ],
  "properties": {
    "$schema": {
      "type": "string"
    },
    "name": {
      "type": "string",
      "minLength": 1,
      "maxLength": 200,
      "description": "A short name for the log, used in reports and artifacts."
    },
    "missing": {
      "type": "array",
      "items": {
        "type": "string",
        "maxLength": 100
      },
      "maxItems": 100,
      "description": "Cell texts that mean 'missing' in every column unless a column overrides them. Default: the empty cell only."
    },
    "columns": {
      "type": "array",
      "minItems": 1,
      "maxItems": 100000,
      "items": {
        "$ref": "#/$defs/columnSpec"
      }
    }
  },
  "$defs": {
    "columnSpec": {
      "type": "object",
      "additionalProperties": false,
      "required": [
        "name",
        "role"
      ],
      "properties": {
        "name": {
          "type": "string",
          "minLength": 1,
          "maxLength": 200,
          "description": "The column's name as it appears in the file header or record keys."
        },
        "role": {
          "enum": [
            "numeric",
            "categorical",
            "outcome",
            "weight",
            "timestamp",
            "group",
            "true_probability",
            "ignore"
          ],
          "description": "numeric: a numeric feature. categorical: a categorical feature (kept as strings, coded per file). outcome: a 0/1 label. weight: a non-negative sample weight. timestamp: the impression time. group: an id that rows share (viewer, session), never a feature. true_probability: a known probability of an outcome (simulated data only), never a feature. ignore: read past."
        },
        "required": {
          "type": "boolean",
          "description": "Whether a file without this column is refused. Default true."
        },
        "missing": {
          "type": "array",
          "items": {
            "type": "string",
            "maxLength": 100
          },
          "maxItems": 100,
          "description": "Cell texts that mean 'missing' in this column, replacing the dataset-wide list."
        },
        "allowMissing": {
          "type": "boolean",
          "description": "Whether a missing cell is accepted. Default: true for numeric and categorical features, false for other roles."
        },
        "timeUnit": {
          "enum": [
            "s",
            "ms",
            "iso"
          ],
          "description": "For a timestamp: seconds or milliseconds since the Unix epoch, or ISO 8601 text. Default s."
        },
        "outcome": {
          "type": "string",
          "minLength": 1,
          "description": "For a true_probability column: the outcome column it belongs to."
        },
        "description": {
          "type": "string",
          "maxLength": 2000
        }
      }
    }
  }
} as const;

/**
 * Declares what each column of an impression log means to Leafcast. Columns not listed are ignored.
 */
export interface DatasetSchema {
  $schema?: string;
  /**
   * A short name for the log, used in reports and artifacts.
   */
  name: string;
  /**
   * Cell texts that mean 'missing' in every column unless a column overrides them. Default: the empty cell only.
   *
   * @maxItems 100
   */
  missing?: string[];
  /**
   * @minItems 1
   * @maxItems 100000
   */
  columns: ColumnSpec[];
}
/**
 * This interface was referenced by `DatasetSchema`'s JSON-Schema
 * via the `definition` "columnSpec".
 */
export interface ColumnSpec {
  /**
   * The column's name as it appears in the file header or record keys.
   */
  name: string;
  /**
   * numeric: a numeric feature. categorical: a categorical feature (kept as strings, coded per file). outcome: a 0/1 label. weight: a non-negative sample weight. timestamp: the impression time. group: an id that rows share (viewer, session), never a feature. true_probability: a known probability of an outcome (simulated data only), never a feature. ignore: read past.
   */
  role:
    | "numeric"
    | "categorical"
    | "outcome"
    | "weight"
    | "timestamp"
    | "group"
    | "true_probability"
    | "ignore";
  /**
   * Whether a file without this column is refused. Default true.
   */
  required?: boolean;
  /**
   * Cell texts that mean 'missing' in this column, replacing the dataset-wide list.
   *
   * @maxItems 100
   */
  missing?: string[];
  /**
   * Whether a missing cell is accepted. Default: true for numeric and categorical features, false for other roles.
   */
  allowMissing?: boolean;
  /**
   * For a timestamp: seconds or milliseconds since the Unix epoch, or ISO 8601 text. Default s.
   */
  timeUnit?: "s" | "ms" | "iso";
  /**
   * For a true_probability column: the outcome column it belongs to.
   */
  outcome?: string;
  description?: string;
}
