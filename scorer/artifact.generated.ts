// Generated from schemas/scorer-artifact.schema.json by schemas/generate.ts: do not edit; run `npm run schemas`.

export const artifactSchemaDocument = {
  "$schema": "https://json-schema.org/draft/2020-12/schema",
  "$id": "https://leafcast.dev/schemas/scorer-artifact.schema.json",
  "title": "ScorerArtifact",
  "description": "A trained Leafcast model as the scorer runtime loads it: forests whose reached leaves are one-hot features, and one logistic head per outcome over those leaves, hashed categoricals and standardized numerics. Every array is flat (no object per node); numbers are written as the shortest text that reads back to the same double.",
  "type": "object",
  "additionalProperties": false,
  "required": [
    "format",
    "formatVersion",
    "checksum",
    "contract",
    "forests",
    "heads",
    "provenance"
  ],
  "properties": {
    "format": {
      "const": "leafcast-scorer",
      "description": "Identifies the file as a Leafcast scorer artifact."
    },
    "formatVersion": {
      "const": 1,
      "description": "The layout version. A runtime refuses any version it was not written for."
    },
    "checksum": {
      "type": "string",
      "pattern": "^sha256:[0-9a-f]{64}$",
      "description": "\"sha256:\" and the lowercase hex SHA-256 of the UTF-8 bytes of the artifact's canonical form: the whole document without this field, written with no whitespace, object keys sorted by UTF-16 code units, strings and numbers as JSON.stringify writes them (numbers as the shortest round-trip text)."
    },
    "contract": {
      "$ref": "#/$defs/contract"
    },
    "forests": {
      "type": "array",
      "maxItems": 64,
      "items": {
        "$ref": "#/$defs/forest"
      },
      "description": "The forests, in the order their leaves take in the encoded index space."
    },
    "heads": {
      "type": "array",
      "minItems": 1,
      "maxItems": 64,
      "items": {
        "$ref": "#/$defs/head"
      },
      "description": "One logistic head per outcome."
    },
    "provenance": {
      "$ref": "#/$defs/provenance"
    }
  },
  "$defs": {
    "name": {
      "type": "string",
      "minLength": 1,
      "maxLength": 200
    },
    "contract": {
      "type": "object",
      "additionalProperties": false,
      "required": [
        "numeric",
        "categorical",
        "missingValues",
        "hashing",
        "standardized"
      ],
      "description": "What the model reads. Feature index i < numeric.length is numeric feature i; index numeric.length + j is categorical feature j.",
      "properties": {
        "numeric": {
          "type": "array",
          "maxItems": 100000,
          "items": {
            "$ref": "#/$defs/name"
          },
          "description": "Numeric features, in feature-index order."
        },
        "categorical": {
          "type": "array",
          "maxItems": 100000,
          "items": {
            "$ref": "#/$defs/categoricalFeature"
          },
          "description": "Categorical features, in feature-index order after the numeric ones."
        },
        "missingValues": {
          "const": "tree-default-direction",
          "description": "How missing values are read. A numeric value is missing when it is null, absent or NaN; a categorical value when it is null, absent, or (for the trees only) not among the feature's values. At a tree node a missing value goes the node's missingRight direction; a missing categorical value adds no hashed feature; a missing standardized numeric adds 0."
        },
        "hashing": {
          "$ref": "#/$defs/hashing"
        },
        "standardized": {
          "type": "array",
          "maxItems": 100000,
          "items": {
            "$ref": "#/$defs/standardizedFeature"
          },
          "description": "Numeric features the heads read directly, as (x - mean) / std; slot j of the numeric region."
        }
      }
    },
    "categoricalFeature": {
      "type": "object",
      "additionalProperties": false,
      "required": [
        "name",
        "values"
      ],
      "properties": {
        "name": {
          "$ref": "#/$defs/name"
        },
        "values": {
          "type": "array",
          "maxItems": 65536,
          "items": {
            "type": "string",
            "maxLength": 1000
          },
          "description": "The values the trees split on, in code order (code = position). Empty for a feature only the heads read (hashed)."
        }
      }
    },
    "hashing": {
      "type": "object",
      "additionalProperties": false,
      "required": [
        "function",
        "keyFormat",
        "bits",
        "seed",
        "columns",
        "crosses"
      ],
      "properties": {
        "function": {
          "const": "murmur3-x86-32",
          "description": "MurmurHash3, x86 32-bit variant, over the UTF-8 bytes of the key."
        },
        "keyFormat": {
          "const": "{column}={value}&{column}={value}",
          "description": "The key of a categorical value is `${column}=${value}`; the key of a cross joins its columns' keys with \"&\" in the listed order: `${a}=${x}&${b}=${y}`. A cross with any missing value adds nothing."
        },
        "bits": {
          "type": "integer",
          "minimum": 1,
          "maximum": 28,
          "description": "The hashed region has 2^bits buckets; a key's bucket is hash & (2^bits - 1)."
        },
        "seed": {
          "type": "integer",
          "minimum": 0,
          "maximum": 4294967295,
          "description": "The hash seed."
        },
        "columns": {
          "type": "array",
          "maxItems": 10000,
          "items": {
            "$ref": "#/$defs/name"
          },
          "description": "Categorical features hashed one by one."
        },
        "crosses": {
          "type": "array",
          "maxItems": 10000,
          "items": {
            "type": "array",
            "minItems": 2,
            "maxItems": 4,
            "items": {
              "$ref": "#/$defs/name"
            }
          },
          "description": "Crosses of categorical features, each hashed as one feature."
        }
      }
    },
    "standardizedFeature": {
      "type": "object",
      "additionalProperties": false,
      "required": [
        "feature",
        "mean",
        "std"
      ],
      "properties": {
        "feature": {
          "$ref": "#/$defs/name"
        },
        "mean": {
          "type": "number"
        },
        "std": {
          "type": "number",
          "exclusiveMinimum": 0
        }
      }
    },
    "forest": {
      "type": "object",
      "additionalProperties": false,
      "required": [
        "outcome",
        "baseLogit",
        "depth",
        "treeCount",
        "feature",
        "threshold",
        "missingRight",
        "categorySplits",
        "leafValue"
      ],
      "description": "Trees in the implicit complete layout: node i has children 2i + 1 (left) and 2i + 2 (right); each tree has 2^depth - 1 internal nodes and 2^depth leaves, and tree t's node i is entry t * (2^depth - 1) + i of the node arrays.",
      "properties": {
        "outcome": {
          "$ref": "#/$defs/name"
        },
        "baseLogit": {
          "type": "number",
          "description": "The forest's starting log-odds; its raw score is baseLogit plus the reached leaves' values."
        },
        "depth": {
          "type": "integer",
          "minimum": 1,
          "maximum": 16
        },
        "treeCount": {
          "type": "integer",
          "minimum": 0,
          "maximum": 100000
        },
        "feature": {
          "type": "array",
          "items": {
            "type": "integer",
            "minimum": -1
          },
          "description": "Per internal node: the feature index, or -1 for a pass-through node that always goes left (padding of a tree that stopped early)."
        },
        "threshold": {
          "type": "array",
          "items": {
            "type": "number"
          },
          "description": "Per internal node: a numeric node goes right when the value is greater than this; 0 for categorical and pass-through nodes."
        },
        "missingRight": {
          "type": "array",
          "items": {
            "type": "integer",
            "minimum": 0,
            "maximum": 1
          },
          "description": "Per internal node: 1 when a missing value goes right, else 0."
        },
        "categorySplits": {
          "type": "array",
          "items": {
            "type": "integer",
            "minimum": 0
          },
          "description": "For categorical nodes, flat runs of [node entry, count, code, code, ...]: the codes that go right, ascending. A categorical node without a run sends every present value left."
        },
        "leafValue": {
          "type": "array",
          "items": {
            "type": "number"
          },
          "description": "Per leaf (tree t's leaf k is entry t * 2^depth + k): the leaf value, learning rate applied."
        }
      }
    },
    "head": {
      "type": "object",
      "additionalProperties": false,
      "required": [
        "outcome",
        "bias",
        "indexDelta",
        "weight",
        "negativeKeepRate",
        "valueWeight"
      ],
      "description": "A logistic head over the encoded index space: [every forest's leaves, forest by forest, tree by tree, 2^depth each], then [2^bits hashed buckets], then [one slot per standardized feature]. p = sigmoid(bias + sum of weights of the present entries (standardized slots times their value)); the served probability is q = p / (p + (1 - p) / negativeKeepRate).",
      "properties": {
        "outcome": {
          "$ref": "#/$defs/name"
        },
        "bias": {
          "type": "number"
        },
        "indexDelta": {
          "type": "array",
          "items": {
            "type": "integer",
            "minimum": 0
          },
          "description": "The encoded indexes with a non-zero weight, strictly ascending, delta-coded to keep the file short: the first index, then each index minus the one before it (at least 1)."
        },
        "weight": {
          "type": "array",
          "items": {
            "type": "number"
          },
          "description": "The weight of each index, in the same order."
        },
        "negativeKeepRate": {
          "type": "number",
          "exclusiveMinimum": 0,
          "maximum": 1,
          "description": "The share of negatives the head was trained on (1: all, no correction)."
        },
        "valueWeight": {
          "type": "number",
          "description": "This outcome's weight in the combined ranking score: the sum over heads of valueWeight times q."
        }
      }
    },
    "provenance": {
      "type": "object",
      "additionalProperties": false,
      "required": [
        "toolVersion",
        "createdAt",
        "dataWindows",
        "metrics"
      ],
      "properties": {
        "name": {
          "type": "string",
          "maxLength": 200,
          "description": "A short name for the model."
        },
        "toolVersion": {
          "type": "string",
          "minLength": 1,
          "maxLength": 100
        },
        "createdAt": {
          "type": "string",
          "pattern": "^\\d{4}-\\d{2}-\\d{2}T\\d{2}:\\d{2}:\\d{2}(\\.\\d+)?Z$",
          "description": "When the artifact was exported, ISO 8601 in UTC."
        },
        "dataWindows": {
          "type": "array",
          "maxItems": 1000,
          "items": {
            "$ref": "#/$defs/dataWindow"
          },
          "description": "The data each stage learned from."
        },
        "metrics": {
          "type": "object",
          "additionalProperties": {
            "type": "object",
            "additionalProperties": {
              "type": "number"
            }
          },
          "description": "Metrics at export, per outcome: metric name to value (e.g. normalizedEntropy, auc, calibration)."
        }
      }
    },
    "dataWindow": {
      "type": "object",
      "additionalProperties": false,
      "required": [
        "stage",
        "rows",
        "from",
        "to"
      ],
      "properties": {
        "stage": {
          "type": "string",
          "minLength": 1,
          "maxLength": 100,
          "description": "What learned from it, e.g. \"trees\" or \"heads\"."
        },
        "files": {
          "type": "array",
          "maxItems": 10000,
          "items": {
            "type": "string",
            "maxLength": 1000
          }
        },
        "rows": {
          "type": "integer",
          "minimum": 0
        },
        "from": {
          "type": [
            "string",
            "null"
          ],
          "maxLength": 100,
          "description": "The earliest impression time (ISO 8601), null when the data has no timestamps."
        },
        "to": {
          "type": [
            "string",
            "null"
          ],
          "maxLength": 100,
          "description": "The latest impression time (ISO 8601), null when the data has no timestamps."
        }
      }
    }
  }
} as const;

/**
 * This interface was referenced by `ScorerArtifact`'s JSON-Schema
 * via the `definition` "name".
 */
export type Name = string;

/**
 * A trained Leafcast model as the scorer runtime loads it: forests whose reached leaves are one-hot features, and one logistic head per outcome over those leaves, hashed categoricals and standardized numerics. Every array is flat (no object per node); numbers are written as the shortest text that reads back to the same double.
 */
export interface ScorerArtifact {
  /**
   * Identifies the file as a Leafcast scorer artifact.
   */
  format: "leafcast-scorer";
  /**
   * The layout version. A runtime refuses any version it was not written for.
   */
  formatVersion: 1;
  /**
   * "sha256:" and the lowercase hex SHA-256 of the UTF-8 bytes of the artifact's canonical form: the whole document without this field, written with no whitespace, object keys sorted by UTF-16 code units, strings and numbers as JSON.stringify writes them (numbers as the shortest round-trip text).
   */
  checksum: string;
  contract: Contract;
  /**
   * The forests, in the order their leaves take in the encoded index space.
   *
   * @maxItems 64
   */
  forests: Forest[];
  /**
   * One logistic head per outcome.
   *
   * @minItems 1
   * @maxItems 64
   */
  heads: Head[];
  provenance: Provenance;
}
/**
 * What the model reads. Feature index i < numeric.length is numeric feature i; index numeric.length + j is categorical feature j.
 *
 * This interface was referenced by `ScorerArtifact`'s JSON-Schema
 * via the `definition` "contract".
 */
export interface Contract {
  /**
   * Numeric features, in feature-index order.
   *
   * @maxItems 100000
   */
  numeric: Name[];
  /**
   * Categorical features, in feature-index order after the numeric ones.
   *
   * @maxItems 100000
   */
  categorical: CategoricalFeature[];
  /**
   * How missing values are read. A numeric value is missing when it is null, absent or NaN; a categorical value when it is null, absent, or (for the trees only) not among the feature's values. At a tree node a missing value goes the node's missingRight direction; a missing categorical value adds no hashed feature; a missing standardized numeric adds 0.
   */
  missingValues: "tree-default-direction";
  hashing: Hashing;
  /**
   * Numeric features the heads read directly, as (x - mean) / std; slot j of the numeric region.
   *
   * @maxItems 100000
   */
  standardized: StandardizedFeature[];
}
/**
 * This interface was referenced by `ScorerArtifact`'s JSON-Schema
 * via the `definition` "categoricalFeature".
 */
export interface CategoricalFeature {
  name: Name;
  /**
   * The values the trees split on, in code order (code = position). Empty for a feature only the heads read (hashed).
   *
   * @maxItems 65536
   */
  values: string[];
}
/**
 * This interface was referenced by `ScorerArtifact`'s JSON-Schema
 * via the `definition` "hashing".
 */
export interface Hashing {
  /**
   * MurmurHash3, x86 32-bit variant, over the UTF-8 bytes of the key.
   */
  function: "murmur3-x86-32";
  /**
   * The key of a categorical value is `${column}=${value}`; the key of a cross joins its columns' keys with "&" in the listed order: `${a}=${x}&${b}=${y}`. A cross with any missing value adds nothing.
   */
  keyFormat: "{column}={value}&{column}={value}";
  /**
   * The hashed region has 2^bits buckets; a key's bucket is hash & (2^bits - 1).
   */
  bits: number;
  /**
   * The hash seed.
   */
  seed: number;
  /**
   * Categorical features hashed one by one.
   *
   * @maxItems 10000
   */
  columns: Name[];
  /**
   * Crosses of categorical features, each hashed as one feature.
   *
   * @maxItems 10000
   */
  crosses: Name[][];
}
/**
 * This interface was referenced by `ScorerArtifact`'s JSON-Schema
 * via the `definition` "standardizedFeature".
 */
export interface StandardizedFeature {
  feature: Name;
  mean: number;
  std: number;
}
/**
 * Trees in the implicit complete layout: node i has children 2i + 1 (left) and 2i + 2 (right); each tree has 2^depth - 1 internal nodes and 2^depth leaves, and tree t's node i is entry t * (2^depth - 1) + i of the node arrays.
 *
 * This interface was referenced by `ScorerArtifact`'s JSON-Schema
 * via the `definition` "forest".
 */
export interface Forest {
  outcome: Name;
  /**
   * The forest's starting log-odds; its raw score is baseLogit plus the reached leaves' values.
   */
  baseLogit: number;
  depth: number;
  treeCount: number;
  /**
   * Per internal node: the feature index, or -1 for a pass-through node that always goes left (padding of a tree that stopped early).
   */
  feature: number[];
  /**
   * Per internal node: a numeric node goes right when the value is greater than this; 0 for categorical and pass-through nodes.
   */
  threshold: number[];
  /**
   * Per internal node: 1 when a missing value goes right, else 0.
   */
  missingRight: number[];
  /**
   * For categorical nodes, flat runs of [node entry, count, code, code, ...]: the codes that go right, ascending. A categorical node without a run sends every present value left.
   */
  categorySplits: number[];
  /**
   * Per leaf (tree t's leaf k is entry t * 2^depth + k): the leaf value, learning rate applied.
   */
  leafValue: number[];
}
/**
 * A logistic head over the encoded index space: [every forest's leaves, forest by forest, tree by tree, 2^depth each], then [2^bits hashed buckets], then [one slot per standardized feature]. p = sigmoid(bias + sum of weights of the present entries (standardized slots times their value)); the served probability is q = p / (p + (1 - p) / negativeKeepRate).
 *
 * This interface was referenced by `ScorerArtifact`'s JSON-Schema
 * via the `definition` "head".
 */
export interface Head {
  outcome: Name;
  bias: number;
  /**
   * The encoded indexes with a non-zero weight, strictly ascending, delta-coded to keep the file short: the first index, then each index minus the one before it (at least 1).
   */
  indexDelta: number[];
  /**
   * The weight of each index, in the same order.
   */
  weight: number[];
  /**
   * The share of negatives the head was trained on (1: all, no correction).
   */
  negativeKeepRate: number;
  /**
   * This outcome's weight in the combined ranking score: the sum over heads of valueWeight times q.
   */
  valueWeight: number;
}
/**
 * This interface was referenced by `ScorerArtifact`'s JSON-Schema
 * via the `definition` "provenance".
 */
export interface Provenance {
  /**
   * A short name for the model.
   */
  name?: string;
  toolVersion: string;
  /**
   * When the artifact was exported, ISO 8601 in UTC.
   */
  createdAt: string;
  /**
   * The data each stage learned from.
   *
   * @maxItems 1000
   */
  dataWindows: DataWindow[];
  /**
   * Metrics at export, per outcome: metric name to value (e.g. normalizedEntropy, auc, calibration).
   */
  metrics: {
    [k: string]:
      | {
          [k: string]: number | undefined;
        }
      | undefined;
  };
}
/**
 * This interface was referenced by `ScorerArtifact`'s JSON-Schema
 * via the `definition` "dataWindow".
 */
export interface DataWindow {
  /**
   * What learned from it, e.g. "trees" or "heads".
   */
  stage: string;
  /**
   * @maxItems 10000
   */
  files?: string[];
  rows: number;
  /**
   * The earliest impression time (ISO 8601), null when the data has no timestamps.
   */
  from: string | null;
  /**
   * The latest impression time (ISO 8601), null when the data has no timestamps.
   */
  to: string | null;
}
