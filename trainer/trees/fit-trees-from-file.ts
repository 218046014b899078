import { createHash } from "node:crypto";
import { CategoryDictionary } from "../data/category-dictionary.js";
import { openDataFile } from "../data/open-data-file.js";
import { LeafcastError } from "../errors.js";
import { fingerprintSchema } from "../heads/fingerprint-schema.js";
import { inputFileIdentities } from "../io/input-file-identity.js";
import { writeFileAtomic } from "../io/write-file-atomic.js";
import type { ResolvedSchema } from "../schema/load-dataset-schema.js";
import {
  checkConfigAgainstSchema,
  type ResolvedTrainingConfig,
} from "../schema/load-training-config.js";
import { binFeatures } from "./bin-features.js";
import { checkForestCheckpointInputs } from "./check-forest-checkpoint-inputs.js";
import { encodeForestCheckpoint } from "./encode-forest-checkpoint.js";
import { fingerprintCheckpointSample } from "./fingerprint-checkpoint-sample.js";
import {
  fitForests,
  type ForestCheckpointing,
  type ForestTarget,
  type TreeProgress,
} from "./fit-forests.js";
import type { ForestCheckpoint, ForestCheckpointInputs } from "./forest-checkpoint.js";
import { openForestCheckpoint } from "./open-forest-checkpoint.js";
import { forestFileOf, type ForestFile } from "./forest-file.js";
import { RowReservoir } from "./row-reservoir.js";
import { weightedPositiveRate } from "./weighted-positive-rate.js";
import { rejectsPathOfFile } from "../data/rejects-path-of-file.js";

export interface FitTreesFromFileOptions {
  readonly onProgress?: (progress: TreeProgress) => void;
  /** Bad-row policy of the read (default "fail"); see openDataFile. */
  readonly badRows?: "fail" | "skip";
  readonly rejectsPath?: string;
  readonly signal?: AbortSignal;
  /**
   * Where to keep a checkpoint (e.g. `<out>.checkpoint`): saved atomically every
   * config.checkpoint.everyTrees trees (and/or checkpointSeconds), and resumed
   * from when one made from the same files, schema, settings and sample is
   * there. The caller removes it once the forests are saved.
   */
  readonly checkpointPath?: string;
  /** Also save a checkpoint once this many seconds have passed since the last (default 0: by trees only). */
  readonly checkpointSeconds?: number;
  /** Ignore (and in time overwrite) a checkpoint found at checkpointPath instead of resuming. */
  readonly restart?: boolean;
  /** Told how many trees a checkpoint gave back, when the run resumes from one. */
  readonly onResume?: (trees: number) => void;
}

export interface FitTreesFromFileResult {
  readonly forests: ForestFile;
  /** Rows read from the file and rows kept in the fitting sample. */
  readonly rowsRead: number;
  readonly rowsSampled: number;
  /** Weighted positive rate of every outcome in the sample. */
  readonly positiveRate: ReadonlyMap<string, number>;
}

/**
 * Reads a data file, keeps a uniform seeded sample of at most
 * config.trees.sampleRows rows, bins the features once and fits one forest per
 * outcome: config.trees.outcomes, or else every outcome of the schema whose
 * positive rate in the sample is at least config.trees.minForestRate. Save the
 * result with writeForestFile.
 *
 * @example
 * const { forests } = await fitTreesFromFile("plots.parquet", schema, config, { onProgress: print });
 * await writeForestFile("runs/demo/forests.json", forests);
 */
export async function fitTreesFromFile(
  dataPath: string | readonly string[],
  schema: ResolvedSchema,
  config: ResolvedTrainingConfig,
  options: FitTreesFromFileOptions = {},
): Promise<FitTreesFromFileResult> {
  checkConfigAgainstSchema(config, schema);
  const settings = config.trees;
  const extraNumbers = [schema.weight, schema.timestamp].filter((n): n is string => n !== null);
  const reservoir = new RowReservoir(
    {
      numbers: [...schema.numeric, ...extraNumbers],
      categories: schema.categorical,
      labels: schema.outcomes,
    },
    settings.sampleRows,
    config.seed,
  );
  // One dictionary per categorical column across all files, so a code means one value everywhere.
  const dictionaries = new Map<string, CategoryDictionary>();
  const paths = typeof dataPath === "string" ? [dataPath] : dataPath;
  const checkpointPath = options.checkpointPath;
  const files = await inputFileIdentities(paths);
  const saved =
    checkpointPath === undefined || options.restart === true
      ? null
      : await openForestCheckpoint(checkpointPath, files);
  for (const [i, path] of paths.entries()) {
    const reader = openDataFile(path, schema, {
      batchRows: config.batchRows,
      badRows: options.badRows,
      rejectsPath: rejectsPathOfFile(options.rejectsPath, i, paths.length),
      signal: options.signal,
      dictionaries,
    });
    for await (const batch of reader.batches()) reservoir.add(batch);
  }
  const n = reservoir.size;
  const weight = schema.weight === null ? null : reservoir.numbers(schema.weight);
  const positiveRate = new Map<string, number>();
  for (const outcome of schema.outcomes)
    positiveRate.set(outcome, weightedPositiveRate(reservoir.labels(outcome), weight));
  const outcomes =
    settings.outcomes ??
    schema.outcomes.filter((outcome) => (positiveRate.get(outcome) ?? 0) >= settings.minForestRate);
  if (outcomes.length === 0) {
    const rates = [...positiveRate].map(([o, r]) => `${o} ${r.toFixed(4)}`).join(", ");
    throw new LeafcastError("trees", [
      {
        code: "no_forest_outcome",
        message: `expected an outcome with a positive rate of at least ${settings.minForestRate} (trees.minForestRate), found ${rates || "no rows"}`,
        file: typeof dataPath === "string" ? dataPath : dataPath.join(", "),
      },
    ]);
  }
  const binned = binFeatures(
    {
      rowCount: n,
      numeric: schema.numeric.map((name) => ({ name, values: reservoir.numbers(name) })),
      categorical: schema.categorical.map((name) => ({
        name,
        codes: reservoir.codes(name),
        dictionary: reservoir.dictionary(name),
      })),
    },
    {
      bins: settings.bins,
      binSampleRows: settings.binSampleRows,
      maxCategories: settings.maxCategories,
      seed: config.seed,
    },
  );
  const targets: ForestTarget[] = outcomes.map((outcome) => ({
    outcome,
    label: reservoir.labels(outcome),
  }));
  const timestamp = schema.timestamp === null ? null : reservoir.numbers(schema.timestamp);
  let checkpoint: ForestCheckpointing | undefined;
  if (checkpointPath !== undefined) {
    const inputs: ForestCheckpointInputs = {
      files,
      schema: fingerprintSchema(schema),
      settings: `sha256:${createHash("sha256")
        .update(JSON.stringify({ seed: config.seed, trees: settings }))
        .digest("hex")}`,
      sample: fingerprintCheckpointSample(binned, targets, weight, timestamp),
    };
    if (saved !== null) {
      checkForestCheckpointInputs(saved.inputs, inputs, checkpointPath);
      options.onResume?.(saved.forests.reduce((sum, forest) => sum + forest.trees.length, 0));
    }
    checkpoint = {
      resume: saved?.forests ?? null,
      everyTrees: config.checkpoint.everyTrees,
      everySeconds: options.checkpointSeconds ?? 0,
      save: (forests: ForestCheckpoint["forests"]) =>
        writeFileAtomic(checkpointPath, encodeForestCheckpoint({ inputs, forests })),
    };
  }
  const fitted = await fitForests(binned, targets, {
    settings,
    seed: config.seed,
    workers: config.workers,
    weight,
    timestamp,
    onProgress: options.onProgress,
    checkpoint,
  });
  return {
    forests: forestFileOf(binned, fitted, settings, config.seed),
    rowsRead: reservoir.seen,
    rowsSampled: n,
    positiveRate,
  };
}
