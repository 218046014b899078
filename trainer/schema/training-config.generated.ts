// Generated from schemas/training-config.schema.json by schemas/generate.ts: do not edit; run `npm run schemas`.

export const trainingConfigDocument = {
  "$schema": "https://json-schema.org/draft/2020-12/schema",
  "$id": "https://leafcast.dev/schemas/training-config.schema.json",
  "title": "TrainingConfig",
  "description": "How Leafcast fits trees and learns heads. Every field is optional; omitted fields take the defaults described here.",
  "type": "object",
  "additionalProperties": false,
  "properties": {
    "$schema": {
      "type": "string"
    },
    "seed": {
      "type": "integer",
      "minimum": 0,
      "maximum": 4294967295,
      "description": "Seed for every random choice (row and feature sampling, validation split). Default 1."
    },
    "workers": {
      "type": "integer",
      "minimum": 0,
      "maximum": 256,
      "description": "Worker threads for histogram building and head updates; 0 means one per core. Default 0."
    },
    "batchRows": {
      "type": "integer",
      "minimum": 1,
      "maximum": 10000000,
      "description": "Rows per batch when streaming a file. Default 65536."
    },
    "trees": {
      "$ref": "#/$defs/trees"
    },
    "heads": {
      "$ref": "#/$defs/heads"
    },
    "checkpoint": {
      "$ref": "#/$defs/checkpoint"
    }
  },
  "$defs": {
    "trees": {
      "type": "object",
      "additionalProperties": false,
      "properties": {
        "outcomes": {
          "type": "array",
          "items": {
            "type": "string",
            "minLength": 1
          },
          "uniqueItems": true,
          "maxItems": 64,
          "description": "Outcomes that get a forest of their own. Default: outcomes whose positive rate is at least minForestRate."
        },
        "minForestRate": {
          "type": "number",
          "minimum": 0,
          "maximum": 1,
          "description": "When outcomes is omitted, the positive rate an outcome needs for a forest. Default 0.02."
        },
        "count": {
          "type": "integer",
          "minimum": 1,
          "maximum": 100000,
          "description": "Trees per forest (the most; early stopping may use fewer). Default 100."
        },
        "depth": {
          "type": "integer",
          "minimum": 1,
          "maximum": 16,
          "description": "Depth limit of every tree. Default 6."
        },
        "leaves": {
          "type": "integer",
          "minimum": 2,
          "maximum": 65536,
          "description": "Leaf-count limit of every tree. Default 2^depth."
        },
        "learningRate": {
          "type": "number",
          "exclusiveMinimum": 0,
          "maximum": 1,
          "description": "Shrinkage applied to every tree's leaf values. Default 0.1."
        },
        "bins": {
          "type": "integer",
          "minimum": 2,
          "maximum": 255,
          "description": "Quantile bins per numeric feature (one more bin holds missing values). Default 255."
        },
        "binSampleRows": {
          "type": "integer",
          "minimum": 100,
          "description": "Rows sampled to place the bin edges. Default 200000."
        },
        "l2": {
          "type": "number",
          "minimum": 0,
          "description": "L2 penalty on leaf values (lambda in -G / (H + lambda)). Default 1."
        },
        "minLeafHessian": {
          "type": "number",
          "minimum": 0,
          "description": "Smallest hessian sum a leaf may hold. Default 1e-3."
        },
        "minSplitGain": {
          "type": "number",
          "minimum": 0,
          "description": "Smallest loss reduction a split must bring. Default 0."
        },
        "rowFraction": {
          "type": "number",
          "exclusiveMinimum": 0,
          "maximum": 1,
          "description": "Share of rows each tree sees, drawn anew per tree. Default 1."
        },
        "featureFraction": {
          "type": "number",
          "exclusiveMinimum": 0,
          "maximum": 1,
          "description": "Share of features each tree may split on, drawn anew per tree. Default 1."
        },
        "maxCategories": {
          "type": "integer",
          "minimum": 2,
          "maximum": 254,
          "description": "Categorical features with at most this many distinct values split natively; larger ones are left to the heads. Default 32."
        },
        "validationFraction": {
          "type": "number",
          "minimum": 0,
          "maximum": 0.9,
          "description": "Share of rows held out for early stopping: the latest rows when the data has timestamps, else a seeded random draw. Default 0.1."
        },
        "patience": {
          "type": "integer",
          "minimum": 0,
          "description": "Stop when validation loss has not improved for this many trees; 0 never stops early. Default 20."
        },
        "sampleRows": {
          "type": "integer",
          "minimum": 1,
          "description": "Fit on at most this many rows, drawn uniformly (reservoir) from the files. Default 2000000."
        }
      }
    },
    "heads": {
      "type": "object",
      "additionalProperties": false,
      "properties": {
        "outcomes": {
          "type": "array",
          "items": {
            "type": "string",
            "minLength": 1
          },
          "uniqueItems": true,
          "maxItems": 64,
          "description": "Outcomes that get a head. Default: every outcome in the dataset schema."
        },
        "alpha": {
          "type": "number",
          "exclusiveMinimum": 0,
          "description": "FTRL-Proximal alpha (per-coordinate learning-rate scale). With 100-200 leaf features active per row, larger values let the latest rows swing predictions and hurt calibration. Default 0.01."
        },
        "beta": {
          "type": "number",
          "minimum": 0,
          "description": "FTRL-Proximal beta (learning-rate smoothing). Default 1."
        },
        "lambda1": {
          "type": "number",
          "minimum": 0,
          "description": "FTRL-Proximal L1 strength. Default 0.5."
        },
        "lambda2": {
          "type": "number",
          "minimum": 0,
          "description": "FTRL-Proximal L2 strength. Default 1."
        },
        "hashBits": {
          "type": "integer",
          "minimum": 1,
          "maximum": 28,
          "description": "Hashed categorical features go into 2^hashBits buckets. Default 20."
        },
        "hashSeed": {
          "type": "integer",
          "minimum": 0,
          "maximum": 4294967295,
          "description": "MurmurHash3 seed for categorical hashing. Default 0."
        },
        "hashed": {
          "type": "array",
          "items": {
            "type": "string",
            "minLength": 1
          },
          "uniqueItems": true,
          "description": "Categorical columns hashed into the heads. Default: every categorical column."
        },
        "crosses": {
          "type": "array",
          "items": {
            "type": "array",
            "items": {
              "type": "string",
              "minLength": 1
            },
            "minItems": 2,
            "maxItems": 4
          },
          "description": "Crosses of categorical columns, each hashed as one feature."
        },
        "numeric": {
          "type": "array",
          "items": {
            "type": "string",
            "minLength": 1
          },
          "uniqueItems": true,
          "description": "Numeric features added to the heads standardized (mean 0, variance 1 on the first batch seen). Default none."
        },
        "negativeKeepRate": {
          "type": "object",
          "additionalProperties": {
            "type": "number",
            "exclusiveMinimum": 0,
            "maximum": 1
          },
          "description": "Per outcome, the share of negatives each head trains on; kept negatives are weighted back or the head is re-calibrated. Default 1 (keep all)."
        },
        "downsampleCorrection": {
          "enum": [
            "weight",
            "recalibrate"
          ],
          "description": "weight: kept negatives count 1/rate in the loss. recalibrate: train unweighted and map p to p / (p + (1 - p) / rate). Default recalibrate."
        },
        "sliceHours": {
          "type": "number",
          "exclusiveMinimum": 0,
          "description": "Width of the time slices over which progressive-validation metrics are kept. Default 24."
        },
        "averaging": {
          "type": "object",
          "additionalProperties": false,
          "required": [
            "halfLifeRows"
          ],
          "properties": {
            "halfLifeRows": {
              "type": "integer",
              "minimum": 1,
              "description": "Rows after which a snapshot's share of the average has halved."
            },
            "everyRows": {
              "type": "integer",
              "minimum": 1,
              "description": "Rows between snapshots folded into the average. Each snapshot is one pass over the weights the data has touched (about 34 ms per thread for 4 heads over 2^20 buckets on a 2-core laptop-class machine), so keep it in the tens of thousands of rows for large index spaces. Default halfLifeRows / 8, rounded up."
            }
          },
          "description": "Export an exponential moving average of each head's weights, snapshotted every everyRows rows, instead of the latest weights. The latest weights follow the last few thousand rows: with 100-200 leaf features active per row their noise moves every prediction together, so held-out calibration swings by several per cent between snapshots. A coordinate is exported only while its latest weight is non-zero, so L1 still decides which features a head keeps. Progressive validation still scores with the latest weights. Default: none (export the latest weights)."
        }
      }
    },
    "checkpoint": {
      "type": "object",
      "additionalProperties": false,
      "properties": {
        "everyTrees": {
          "type": "integer",
          "minimum": 1,
          "description": "While fitting trees, save a checkpoint (<out>.checkpoint: the trees so far) every this many trees; a rerun resumes from it. Default 10."
        },
        "everyRows": {
          "type": "integer",
          "minimum": 1,
          "description": "While learning or updating heads, save a checkpoint (<out>.checkpoint: the head state and the position in the input files) every this many rows; a rerun resumes from it. Default 1000000."
        }
      }
    }
  }
} as const;

/**
 * How Leafcast fits trees and learns heads. Every field is optional; omitted fields take the defaults described here.
 */
export interface TrainingConfig {
  $schema?: string;
  /**
   * Seed for every random choice (row and feature sampling, validation split). Default 1.
   */
  seed?: number;
  /**
   * Worker threads for histogram building and head updates; 0 means one per core. Default 0.
   */
  workers?: number;
  /**
   * Rows per batch when streaming a file. Default 65536.
   */
  batchRows?: number;
  trees?: Trees;
  heads?: Heads;
  checkpoint?: Checkpoint;
}
/**
 * This interface was referenced by `TrainingConfig`'s JSON-Schema
 * via the `definition` "trees".
 */
export interface Trees {
  /**
   * Outcomes that get a forest of their own. Default: outcomes whose positive rate is at least minForestRate.
   *
   * @maxItems 64
   */
  outcomes?: string[];
  /**
   * When outcomes is omitted, the positive rate an outcome needs for a forest. Default 0.02.
   */
  minForestRate?: number;
  /**
   * Trees per forest (the most; early stopping may use fewer). Default 100.
   */
  count?: number;
  /**
   * Depth limit of every tree. Default 6.
   */
  depth?: number;
  /**
   * Leaf-count limit of every tree. Default 2^depth.
   */
  leaves?: number;
  /**
   * Shrinkage applied to every tree's leaf values. Default 0.1.
   */
  learningRate?: number;
  /**
   * Quantile bins per numeric feature (one more bin holds missing values). Default 255.
   */
  bins?: number;
  /**
   * Rows sampled to place the bin edges. Default 200000.
   */
  binSampleRows?: number;
  /**
   * L2 penalty on leaf values (lambda in -G / (H + lambda)). Default 1.
   */
  l2?: number;
  /**
   * Smallest hessian sum a leaf may hold. Default 1e-3.
   */
  minLeafHessian?: number;
  /**
   * Smallest loss reduction a split must bring. Default 0.
   */
  minSplitGain?: number;
  /**
   * Share of rows each tree sees, drawn anew per tree. Default 1.
   */
  rowFraction?: number;
  /**
   * Share of features each tree may split on, drawn anew per tree. Default 1.
   */
  featureFraction?: number;
  /**
   * Categorical features with at most this many distinct values split natively; larger ones are left to the heads. Default 32.
   */
  maxCategories?: number;
  /**
   * Share of rows held out for early stopping: the latest rows when the data has timestamps, else a seeded random draw. Default 0.1.
   */
  validationFraction?: number;
  /**
   * Stop when validation loss has not improved for this many trees; 0 never stops early. Default 20.
   */
  patience?: number;
  /**
   * Fit on at most this many rows, drawn uniformly (reservoir) from the files. Default 2000000.
   */
  sampleRows?: number;
}
/**
 * This interface was referenced by `TrainingConfig`'s JSON-Schema
 * via the `definition` "heads".
 */
export interface Heads {
  /**
   * Outcomes that get a head. Default: every outcome in the dataset schema.
   *
   * @maxItems 64
   */
  outcomes?: string[];
  /**
   * FTRL-Proximal alpha (per-coordinate learning-rate scale). With 100-200 leaf features active per row, larger values let the latest rows swing predictions and hurt calibration. Default 0.01.
   */
  alpha?: number;
  /**
   * FTRL-Proximal beta (learning-rate smoothing). Default 1.
   */
  beta?: number;
  /**
   * FTRL-Proximal L1 strength. Default 0.5.
   */
  lambda1?: number;
  /**
   * FTRL-Proximal L2 strength. Default 1.
   */
  lambda2?: number;
  /**
   * Hashed categorical features go into 2^hashBits buckets. Default 20.
   */
  hashBits?: number;
  /**
   * MurmurHash3 seed for categorical hashing. Default 0.
   */
  hashSeed?: number;
  /**
   * Categorical columns hashed into the heads. Default: every categorical column.
   */
  hashed?: string[];
  /**
   * Crosses of categorical columns, each hashed as one feature.
   */
  crosses?: string[][];
  /**
   * Numeric features added to the heads standardized (mean 0, variance 1 on the first batch seen). Default none.
   */
  numeric?: string[];
  /**
   * Per outcome, the share of negatives each head trains on; kept negatives are weighted back or the head is re-calibrated. Default 1 (keep all).
   */
  negativeKeepRate?: {
    [k: string]: number | undefined;
  };
  /**
   * weight: kept negatives count 1/rate in the loss. recalibrate: train unweighted and map p to p / (p + (1 - p) / rate). Default recalibrate.
   */
  downsampleCorrection?: "weight" | "recalibrate";
  /**
   * Width of the time slices over which progressive-validation metrics are kept. Default 24.
   */
  sliceHours?: number;
  /**
   * Export an exponential moving average of each head's weights, snapshotted every everyRows rows, instead of the latest weights. The latest weights follow the last few thousand rows: with 100-200 leaf features active per row their noise moves every prediction together, so held-out calibration swings by several per cent between snapshots. A coordinate is exported only while its latest weight is non-zero, so L1 still decides which features a head keeps. Progressive validation still scores with the latest weights. Default: none (export the latest weights).
   */
  averaging?: {
    /**
     * Rows after which a snapshot's share of the average has halved.
     */
    halfLifeRows: number;
    /**
     * Rows between snapshots folded into the average. Each snapshot is one pass over the weights the data has touched (about 34 ms per thread for 4 heads over 2^20 buckets on a 2-core laptop-class machine), so keep it in the tens of thousands of rows for large index spaces. Default halfLifeRows / 8, rounded up.
     */
    everyRows?: number;
  };
}
/**
 * This interface was referenced by `TrainingConfig`'s JSON-Schema
 * via the `definition` "checkpoint".
 */
export interface Checkpoint {
  /**
   * While fitting trees, save a checkpoint (<out>.checkpoint: the trees so far) every this many trees; a rerun resumes from it. Default 10.
   */
  everyTrees?: number;
  /**
   * While learning or updating heads, save a checkpoint (<out>.checkpoint: the head state and the position in the input files) every this many rows; a rerun resumes from it. Default 1000000.
   */
  everyRows?: number;
}
