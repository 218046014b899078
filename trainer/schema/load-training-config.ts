import { availableParallelism } from "node:os";
import { checkJsonSchema, type JsonSchema } from "../../scorer/json-schema-check.js";
import { LeafcastError, type Issue } from "../errors.js";
import type { ResolvedSchema } from "./load-dataset-schema.js";
import { parseJsonFile } from "./parse-json-file.js";
import { trainingConfigDocument, type TrainingConfig } from "./training-config.generated.js";

/** Tree-fitting settings with defaults filled in (see schemas/training-config.schema.json). */
export interface TreeSettings {
  /** null: decided from the data (outcomes with a positive rate of at least minForestRate). */
  readonly outcomes: readonly string[] | null;
  readonly minForestRate: number;
  readonly count: number;
  readonly depth: number;
  readonly leaves: number;
  readonly learningRate: number;
  readonly bins: number;
  readonly binSampleRows: number;
  readonly l2: number;
  readonly minLeafHessian: number;
  readonly minSplitGain: number;
  readonly rowFraction: number;
  readonly featureFraction: number;
  readonly maxCategories: number;
  readonly validationFraction: number;
  readonly patience: number;
  readonly sampleRows: number;
}

/** Head-learning settings with defaults filled in. */
export interface HeadSettings {
  /** null: every outcome of the dataset schema. */
  readonly outcomes: readonly string[] | null;
  readonly alpha: number;
  readonly beta: number;
  readonly lambda1: number;
  readonly lambda2: number;
  readonly hashBits: number;
  readonly hashSeed: number;
  /** null: every categorical column. */
  readonly hashed: readonly string[] | null;
  readonly crosses: readonly (readonly string[])[];
  readonly numeric: readonly string[];
  readonly negativeKeepRate: Readonly<Record<string, number>>;
  readonly downsampleCorrection: "weight" | "recalibrate";
  readonly sliceHours: number;
  /** Export an exponential moving average of the weights (see HeadAveraging); null exports the latest weights. */
  readonly averaging: HeadAveraging | null;
}

/** How exported weights are averaged: snapshots every `everyRows` rows, each one's share halving every `halfLifeRows`. */
export interface HeadAveraging {
  readonly halfLifeRows: number;
  readonly everyRows: number;
}

export interface ResolvedTrainingConfig {
  readonly seed: number;
  /** Worker threads to use (0 in the file resolves to the number of cores). */
  readonly workers: number;
  readonly batchRows: number;
  readonly trees: TreeSettings;
  readonly heads: HeadSettings;
  readonly checkpoint: { readonly everyTrees: number; readonly everyRows: number };
}

/**
 * Loads and validates a training configuration file; every omitted field takes its default.
 *
 * @example
 * const config = await loadTrainingConfig("runs/demo/config.json");
 * config.trees.depth; // 6 unless the file says otherwise
 */
export async function loadTrainingConfig(path: string): Promise<ResolvedTrainingConfig> {
  return resolveTrainingConfig(await parseJsonFile(path, "config"), path);
}

/** Validates a parsed configuration and fills in defaults; `file` labels errors. */
export function resolveTrainingConfig(
  document: unknown,
  file = "<config>",
): ResolvedTrainingConfig {
  const issues: Issue[] = checkJsonSchema(trainingConfigDocument as JsonSchema, document, {
    exactIntegers: true,
  }).map((issue) => ({
    code: issue.code,
    message: `${issue.path || "/"}: ${issue.message}`,
    file,
  }));
  if (issues.length > 0) throw new LeafcastError("config", issues);
  const doc = document as TrainingConfig;
  const t = doc.trees ?? {};
  const h = doc.heads ?? {};
  const depth = t.depth ?? 6;
  const workers = doc.workers ?? 0;
  return {
    seed: doc.seed ?? 1,
    workers: workers === 0 ? Math.max(1, availableParallelism()) : workers,
    batchRows: doc.batchRows ?? 65536,
    trees: {
      outcomes: t.outcomes ?? null,
      minForestRate: t.minForestRate ?? 0.02,
      count: t.count ?? 100,
      depth,
      leaves: t.leaves ?? 2 ** depth,
      learningRate: t.learningRate ?? 0.1,
      bins: t.bins ?? 255,
      binSampleRows: t.binSampleRows ?? 200_000,
      l2: t.l2 ?? 1,
      minLeafHessian: t.minLeafHessian ?? 1e-3,
      minSplitGain: t.minSplitGain ?? 0,
      rowFraction: t.rowFraction ?? 1,
      featureFraction: t.featureFraction ?? 1,
      maxCategories: t.maxCategories ?? 32,
      validationFraction: t.validationFraction ?? 0.1,
      patience: t.patience ?? 20,
      sampleRows: t.sampleRows ?? 2_000_000,
    },
    heads: {
      outcomes: h.outcomes ?? null,
      alpha: h.alpha ?? 0.01,
      beta: h.beta ?? 1,
      lambda1: h.lambda1 ?? 0.5,
      lambda2: h.lambda2 ?? 1,
      hashBits: h.hashBits ?? 20,
      hashSeed: h.hashSeed ?? 0,
      hashed: h.hashed ?? null,
      crosses: h.crosses ?? [],
      numeric: h.numeric ?? [],
      negativeKeepRate: ownEntries(h.negativeKeepRate ?? {}),
      downsampleCorrection: h.downsampleCorrection ?? "recalibrate",
      sliceHours: h.sliceHours ?? 24,
      averaging:
        h.averaging === undefined
          ? null
          : {
              halfLifeRows: h.averaging.halfLifeRows,
              everyRows: h.averaging.everyRows ?? Math.ceil(h.averaging.halfLifeRows / 8),
            },
    },
    checkpoint: {
      everyTrees: doc.checkpoint?.everyTrees ?? 10,
      everyRows: doc.checkpoint?.everyRows ?? 1_000_000,
    },
  };
}

/**
 * A copy without a prototype: outcomes are column names, and a lookup such as
 * `rates["constructor"]` on a plain object would find Object's constructor, not
 * "no rate given".
 */
function ownEntries(record: { readonly [key: string]: unknown }): Readonly<Record<string, number>> {
  const copy = Object.create(null) as Record<string, number>;
  for (const [key, value] of Object.entries(record)) copy[key] = value as number;
  return copy;
}

/** Checks that every column a configuration names exists in the dataset schema with the right role. */
export function checkConfigAgainstSchema(
  config: ResolvedTrainingConfig,
  schema: ResolvedSchema,
  file = "<config>",
): void {
  const issues: Issue[] = [];
  const expect = (names: readonly string[] | null, role: string, field: string): void => {
    for (const name of names ?? []) {
      const column = schema.byName.get(name);
      if (column?.role !== role) {
        const found = column === undefined ? "no such column" : `a ${column.role} column`;
        issues.push({
          code: "unknown_column",
          message: `${field}: expected "${name}" to be a ${role} column of schema "${schema.name}", found ${found}`,
          file,
        });
      }
    }
  };
  expect(config.trees.outcomes, "outcome", "/trees/outcomes");
  expect(config.heads.outcomes, "outcome", "/heads/outcomes");
  expect(config.heads.hashed, "categorical", "/heads/hashed");
  expect(config.heads.numeric, "numeric", "/heads/numeric");
  config.heads.crosses.forEach((cross, i) => expect(cross, "categorical", `/heads/crosses/${i}`));
  expect(Object.keys(config.heads.negativeKeepRate), "outcome", "/heads/negativeKeepRate");
  if (issues.length > 0) throw new LeafcastError("config", issues);
}
