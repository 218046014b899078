import { encodedLayout } from "../../scorer/encoded-layout.js";
import { RowEncoder } from "../../scorer/row-encoder.js";
import type { ColumnBatch } from "../data/column-batch.js";
import { CategoryDictionary } from "../data/category-dictionary.js";
import { openDataFile, type ReadStats } from "../data/open-data-file.js";
import { LeafcastError } from "../errors.js";
import { batchesAfterCheckpoint, type ReadPosition } from "../heads/batches-after-checkpoint.js";
import { encodeHeadCheckpoint } from "../heads/encode-head-checkpoint.js";
import type { HeadCheckpoint } from "../heads/head-checkpoint.js";
import { headCheckpointInputs } from "../heads/head-checkpoint-inputs.js";
import { openHeadCheckpoint } from "../heads/open-head-checkpoint.js";
import { writeFileAtomic } from "../io/write-file-atomic.js";
import { checkResume } from "../heads/check-resume.js";
import { fingerprintForests } from "../heads/fingerprint-forests.js";
import { fingerprintSchema } from "../heads/fingerprint-schema.js";
import type { HeadBatch, HeadSetup } from "../heads/head-setup.js";
import type { HeadState } from "../heads/head-state.js";
import { learnHeads } from "../heads/learn-heads.js";
import { progressiveReport, type HeadProgressiveReport } from "../heads/progressive-report.js";
import type { ResolvedSchema } from "../schema/load-dataset-schema.js";
import {
  checkConfigAgainstSchema,
  type ResolvedTrainingConfig,
} from "../schema/load-training-config.js";
import type { ForestFile } from "../trees/forest-file.js";
import { headBatchOf, type HeadColumns } from "./head-batch-of.js";
import { headEncodingSpec } from "./head-encoding-spec.js";
import { measureNumericStats, type NumericStats } from "./measure-numeric-stats.js";
import { rejectsPathOfFile } from "../data/rejects-path-of-file.js";

export interface LearnHeadsFromFilesOptions {
  /** Saved heads to continue; refused (LeafcastError from "heads") when learned on other trees, schema or settings. */
  readonly state?: HeadState;
  /**
   * Where to keep a checkpoint (e.g. `<out>.checkpoint`): the state and the
   * position in the files, saved atomically every config.checkpoint.everyRows
   * rows (and/or checkpointSeconds) at a batch boundary. A checkpoint found
   * there that was made from the same files, starting state and batch size is
   * resumed from: the rows it has learned from are read again and dropped, and
   * the result is bit for bit that of an uninterrupted run. The caller removes
   * it once the final state is saved.
   */
  readonly checkpointPath?: string;
  /** Also checkpoint once this many seconds have passed since the last (default 0: by rows only). */
  readonly checkpointSeconds?: number;
  /** Ignore (and in time overwrite) a checkpoint found at checkpointPath instead of resuming. */
  readonly restart?: boolean;
  /** Called after each checkpoint save, e.g. to log. */
  readonly onCheckpoint?: (state: HeadState) => void | Promise<void>;
  /** Told where a run resumes, when it resumes from a checkpoint. */
  readonly onResume?: (checkpoint: HeadCheckpoint) => void;
  /** Bad-row policy of the reads (default "fail"); see openDataFile. */
  readonly badRows?: "fail" | "skip";
  /** Rejected rows go here (with several files: path.1, path.2, ...). */
  readonly rejectsPath?: string;
  /** Worker threads for the heads (default config.workers; 0 trains on this thread). */
  readonly workers?: number;
  readonly signal?: AbortSignal;
}

export interface LearnHeadsFromFilesResult {
  readonly state: HeadState;
  readonly report: HeadProgressiveReport[];
  /** Per file read, in order: rows accepted and rejected. */
  readonly reads: readonly ReadStats[];
}

/**
 * Learns (or, given `options.state`, continues) one FTRL-Proximal head per
 * outcome over data files read in order: every batch is encoded by the scorer's
 * RowEncoder over the forest file's trees plus the configured hashed
 * categoricals, crosses and standardized numerics, then scored and trained on
 * (progressive validation). Numeric means and stds are measured on the first
 * batch of a fresh run and kept in the state, so a resumed run encodes exactly
 * as the first did. One category dictionary per column serves every file.
 *
 * @example
 * const { forests } = await fitTreesFromFile(days.slice(0, 3), schema, config);
 * const first = await learnHeadsFromFiles(days.slice(0, 7), schema, config, forests);
 * const next = await learnHeadsFromFiles([days[7]], schema, config, forests, { state: first.state });
 */
export async function learnHeadsFromFiles(
  paths: readonly string[],
  schema: ResolvedSchema,
  config: ResolvedTrainingConfig,
  forestFile: ForestFile,
  options: LearnHeadsFromFilesOptions = {},
): Promise<LearnHeadsFromFilesResult> {
  checkConfigAgainstSchema(config, schema);
  const settings = config.heads;
  const outcomes = settings.outcomes ?? schema.outcomes;
  const forests = forestFile.forests.map((f) => f.forest);
  const setupWith = (numeric: readonly NumericStats[]): HeadSetup => {
    const encoding = headEncodingSpec(settings, schema, forestFile.contract, numeric);
    return {
      outcomes,
      settings,
      encoding,
      indexSize: encodedLayout(forests, encoding).width,
      seed: config.seed,
      treesFingerprint: fingerprintForests(forests, forestFile.contract),
      schemaFingerprint: fingerprintSchema(schema),
    };
  };

  const checkpointPath = options.checkpointPath;
  const inputs =
    checkpointPath === undefined
      ? null
      : await headCheckpointInputs(
          paths,
          options.state ?? null,
          config.batchRows,
          options.badRows ?? "fail",
        );
  const resume =
    checkpointPath === undefined || inputs === null || options.restart === true
      ? null
      : await openHeadCheckpoint(checkpointPath, inputs);
  if (resume !== null) options.onResume?.(resume);
  const startState = resume?.state ?? options.state;
  const startFile = resume?.position.file ?? 0;
  /** Where the rows learned so far end: the file being read and its rows consumed. */
  const position: ReadPosition = { file: startFile, rows: 0 };

  const dictionaries = new Map<string, CategoryDictionary>();
  const readers = paths.map((path, i) =>
    openDataFile(path, schema, {
      batchRows: config.batchRows,
      badRows: options.badRows,
      rejectsPath: rejectsPathOfFile(options.rejectsPath, i, paths.length),
      signal: options.signal,
      dictionaries,
    }),
  );
  const start = resume?.position ?? { file: 0, rows: 0 };
  const stream = batchesAfterCheckpoint(readers, paths, start, position);

  let first: ColumnBatch | null = null;
  try {
    const setup = await resolveSetup();
    const encoder = new RowEncoder({
      contract: forestFile.contract,
      forests,
      encoding: setup.encoding,
    });
    const columns: HeadColumns = { outcomes, weight: schema.weight, timestamp: schema.timestamp };
    let buffers = encoder.allocate(config.batchRows);
    const encode = (batch: ColumnBatch): HeadBatch => {
      // A Parquet row group or Arrow record batch may exceed batchRows.
      if (batch.rowCount + 1 > buffers.offsets.length) buffers = encoder.allocate(batch.rowCount);
      return headBatchOf(batch, encoder, buffers, columns);
    };
    async function* headBatches(): AsyncGenerator<HeadBatch> {
      const pending = first;
      first = null;
      if (pending !== null) yield encode(pending);
      for await (const batch of stream) yield encode(batch);
    }
    const readsBefore = resume?.reads ?? [];
    const reads = (): ReadStats[] => [
      ...readsBefore,
      ...readers.slice(startFile, position.file).map((r) => ({ ...r.stats })),
    ];
    const state = await learnHeads(headBatches(), setup, {
      state: startState,
      workers: options.workers ?? config.workers,
      everyRows: config.checkpoint.everyRows,
      everySeconds: options.checkpointSeconds,
      onCheckpoint: async (s) => {
        if (checkpointPath !== undefined && inputs !== null) {
          const checkpoint = { inputs, position: { ...position }, reads: reads(), state: s };
          await writeFileAtomic(checkpointPath, encodeHeadCheckpoint(checkpoint));
        }
        await options.onCheckpoint?.(s);
      },
    });
    return {
      state,
      report: progressiveReport(state),
      reads: [...readsBefore, ...readers.slice(startFile).map((r) => r.stats)],
    };
  } finally {
    // Closes the file being read when learning stopped early (a refused resume, a bad row).
    await stream.return(undefined);
  }

  /** The setup: a resumed run reuses the saved numeric means and stds, a fresh one measures them on the first batch. */
  async function resolveSetup(): Promise<HeadSetup> {
    if (startState !== undefined) {
      // Measuring again would move every numeric weight's meaning.
      const saved = new Map(startState.info.encoding.numeric.map((s) => [s.name, s]));
      const reused = settings.numeric.map((name) => saved.get(name) ?? { name, mean: 0, std: 1 });
      const setup = setupWith(reused);
      checkResume(startState, setup);
      return setup;
    }
    if (settings.numeric.length === 0) return setupWith([]);
    const next = await stream.next();
    if (next.done === true) {
      throw new LeafcastError("heads", [
        {
          code: "no_rows",
          message: "expected rows to measure the means and stds of heads.numeric on, found none",
          file: paths.join(", "),
        },
      ]);
    }
    first = next.value;
    return setupWith(measureNumericStats(first, settings.numeric));
  }
}
