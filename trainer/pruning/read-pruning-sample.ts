import { CategoryDictionary } from "../data/category-dictionary.js";
import { openDataFile } from "../data/open-data-file.js";
import { LeafcastError } from "../errors.js";
import type { ResolvedSchema } from "../schema/load-dataset-schema.js";
import type { ResolvedTrainingConfig } from "../schema/load-training-config.js";
import { chooseValidationRows } from "../trees/choose-validation-rows.js";
import { RowReservoir } from "../trees/row-reservoir.js";
import { weightedPositiveRate } from "../trees/weighted-positive-rate.js";

/** Rows of the sample on one side of the held-out split, column by column. */
export interface SampleRows {
  readonly rowCount: number;
  readonly numbers: ReadonlyMap<string, Float64Array>;
  /** Category codes into PruningSample.dictionaries (-1: missing). */
  readonly codes: ReadonlyMap<string, Int32Array>;
  readonly labels: ReadonlyMap<string, Uint8Array>;
  readonly weight: Float64Array | null;
  /** Milliseconds since the epoch, when the schema has a timestamp column. */
  readonly timestamp: Float64Array | null;
}

/** The rows every pruning step refits on and scores, read once. */
export interface PruningSample {
  /** Rows read from the files and rows kept in the sample (at most config.trees.sampleRows). */
  readonly rowsRead: number;
  readonly rowsSampled: number;
  readonly train: SampleRows;
  readonly heldOut: SampleRows;
  /** "time": the latest rows by the schema's timestamp; "seeded": a seeded uniform draw. */
  readonly heldOutBy: "time" | "seeded";
  /** The dictionary of each categorical column, shared by both sides (codes mean one text). */
  readonly dictionaries: ReadonlyMap<string, CategoryDictionary>;
  /** Weighted positive rate of each outcome on the training rows (the reference of NE). */
  readonly trainingRate: ReadonlyMap<string, number>;
}

/**
 * Reads data files once into a uniform seeded sample of at most
 * config.trees.sampleRows rows (the sample fitTreesFromFile would fit on), and
 * splits it: `heldOutFraction` of the rows are held out, the latest by the
 * schema's timestamp when it has one (a model is judged on the future it will
 * serve), else a seeded uniform draw (config.seed).
 *
 * @example
 * const sample = await readPruningSample(["plots.parquet"], schema, config, 0.2);
 * sample.heldOut.rowCount; // about a fifth of the sample
 */
export async function readPruningSample(
  paths: readonly string[],
  schema: ResolvedSchema,
  config: ResolvedTrainingConfig,
  heldOutFraction: number,
): Promise<PruningSample> {
  if (!(heldOutFraction > 0 && heldOutFraction < 1)) {
    throw new LeafcastError("pruning", [
      {
        code: "held_out_fraction",
        message: `held-out fraction expected a number strictly between 0 and 1, found ${heldOutFraction}`,
      },
    ]);
  }
  const numbers = [...schema.numeric];
  if (schema.weight !== null) numbers.push(schema.weight);
  if (schema.timestamp !== null) numbers.push(schema.timestamp);
  const reservoir = new RowReservoir(
    { numbers, categories: schema.categorical, labels: schema.outcomes },
    config.trees.sampleRows,
    config.seed,
  );
  const dictionaries = new Map<string, CategoryDictionary>();
  for (const path of paths) {
    const reader = openDataFile(path, schema, { batchRows: config.batchRows, dictionaries });
    for await (const batch of reader.batches()) reservoir.add(batch);
  }
  const n = reservoir.size;
  const timestamp = schema.timestamp === null ? null : reservoir.numbers(schema.timestamp);
  const mask = n < 2 ? null : chooseValidationRows(n, heldOutFraction, timestamp, config.seed);
  if (mask === null || mask.indexOf(0) < 0) {
    throw new LeafcastError("pruning", [
      {
        code: "too_few_rows",
        message: `expected enough rows to hold out ${heldOutFraction} of them and train on the rest, found ${n}`,
        file: paths.join(", "),
      },
    ]);
  }
  const side = (held: number): SampleRows => {
    let rowCount = 0;
    for (let r = 0; r < n; r++) rowCount += mask[r] === held ? 1 : 0;
    const pick = <T extends Float64Array | Int32Array | Uint8Array>(from: T, to: T): T => {
      for (let r = 0, k = 0; r < n; r++) if (mask[r] === held) to[k++] = from[r];
      return to;
    };
    const weight = schema.weight === null ? null : reservoir.numbers(schema.weight);
    return {
      rowCount,
      numbers: new Map(
        schema.numeric.map((c) => [c, pick(reservoir.numbers(c), new Float64Array(rowCount))]),
      ),
      codes: new Map(
        schema.categorical.map((c) => [c, pick(reservoir.codes(c), new Int32Array(rowCount))]),
      ),
      labels: new Map(
        schema.outcomes.map((c) => [c, pick(reservoir.labels(c), new Uint8Array(rowCount))]),
      ),
      weight: weight === null ? null : pick(weight, new Float64Array(rowCount)),
      timestamp: timestamp === null ? null : pick(timestamp, new Float64Array(rowCount)),
    };
  };
  const train = side(0);
  const trainingRate = new Map<string, number>();
  for (const outcome of schema.outcomes) {
    trainingRate.set(
      outcome,
      weightedPositiveRate(train.labels.get(outcome) as Uint8Array, train.weight),
    );
  }
  return {
    rowsRead: reservoir.seen,
    rowsSampled: n,
    train,
    heldOut: side(1),
    heldOutBy: timestamp === null ? "seeded" : "time",
    dictionaries: new Map(
      schema.categorical.map((c) => [c, dictionaries.get(c) ?? new CategoryDictionary()]),
    ),
    trainingRate,
  };
}
