import type { ForestModel } from "../../scorer/model-types.js";
import type { TreeSettings } from "../schema/load-training-config.js";
import type { BinnedFeatures } from "./binned-features.js";
import { checkForestInputs } from "./check-forest-inputs.js";
import { chooseValidationRows } from "./choose-validation-rows.js";
import { CheckpointSchedule } from "../io/checkpoint-schedule.js";
import type { FeatureImportance } from "./feature-importance.js";
import { fitOneForest } from "./fit-one-forest.js";
import { checkCheckpointTargets } from "./check-checkpoint-targets.js";
import type { ForestCheckpointing, ForestProgress } from "./forest-checkpoint.js";
import { lossBlocks, trainPositions } from "./gradient-round.js";
import { COLUMN_SLOTS, SLOT_VALUES } from "./histogram-kernel.js";
import { rowsWhere } from "./rows-where.js";
import { SeededRandom } from "./seeded-random.js";
import { createTrainingBuffers } from "./training-buffers.js";
import { TreeGrower } from "./tree-grower.js";
import { TreeTaskPool } from "./tree-task-pool.js";

/** The tree settings fitForests reads (a TreeSettings from the configuration fits). */
export type ForestSettings = Pick<
  TreeSettings,
  | "count"
  | "depth"
  | "leaves"
  | "learningRate"
  | "l2"
  | "minLeafHessian"
  | "minSplitGain"
  | "rowFraction"
  | "featureFraction"
  | "validationFraction"
  | "patience"
>;

/** One outcome to fit a forest for: its 0/1 label per binned row. */
export interface ForestTarget {
  readonly outcome: string;
  readonly label: Uint8Array;
}

/** Reported after every tree. */
export interface TreeProgress {
  readonly outcome: string;
  /** 1-based forest number and the number of forests. */
  readonly forest: number;
  readonly forests: number;
  /** 1-based tree number and the most trees this forest may get. */
  readonly tree: number;
  readonly trees: number;
  /** Weighted mean log loss after this tree. */
  readonly trainLoss: number;
  readonly validationLoss: number | null;
  readonly elapsedSeconds: number;
  /** Estimate: remaining trees of every forest at the mean time per tree so far. */
  readonly secondsLeft: number;
}

export type { ForestCheckpointing } from "./forest-checkpoint.js";

export interface FitForestsOptions {
  readonly settings: ForestSettings;
  readonly seed: number;
  /** Threads for histograms and partitions; 1 runs everything on the calling thread. */
  readonly workers: number;
  readonly weight?: Float64Array | null;
  /** Milliseconds per row; when given, the latest rows are the validation set. */
  readonly timestamp?: Float64Array | null;
  readonly onProgress?: (progress: TreeProgress) => void;
  /** Also return each forest's final raw scores on every binned row (for checks). */
  readonly returnScores?: boolean;
  /** Rows per histogram block (default 32,768): a node of at most this many rows goes to one worker whole. */
  readonly blockRows?: number;
  /** Periodic checkpoints, and the progress of one to continue from. */
  readonly checkpoint?: ForestCheckpointing;
  /**
   * Use only the JavaScript kernels, not the WebAssembly ones (for tests: both give
   * the same trees bit for bit).
   */
  readonly javascriptKernels?: boolean;
}

/** A fitted forest with what was learned along the way. */
export interface FittedForest {
  readonly forest: ForestModel;
  /** Weighted mean log loss of the training rows after each fitted tree. */
  readonly trainLoss: Float64Array;
  /** The same on the validation rows; null without a validation set. */
  readonly validationLoss: Float64Array | null;
  /** Loss of the starting log-odds alone (before any tree). */
  readonly startTrainLoss: number;
  readonly startValidationLoss: number | null;
  /** Trees fitted; the forest keeps the first forest.trees.length (the best on validation). */
  readonly treesFitted: number;
  readonly importance: readonly FeatureImportance[];
  /** Raw scores of every binned row under the kept trees, when asked for. */
  readonly scores: Float64Array | null;
}

const DEFAULT_BLOCK_ROWS = 32_768;
/** Memory for one round's block histograms; blocks grow when columns are many. */
const BLOCK_HISTOGRAM_BYTES = 64 * 1024 * 1024;

/**
 * Fits one boosted forest per target on rows binned once (binary log loss,
 * Newton boosting, level-wise trees; see TreeGrower and fitOneForest), with
 * histograms, partitions and gradients spread over `workers` threads.
 * Deterministic for a seed, bit for bit whatever the number of workers. The
 * worker threads end before this returns, also when it throws.
 *
 * @example
 * const binned = binFeatures(input, { bins: 255, binSampleRows: 200_000, maxCategories: 32, seed: 1 });
 * const [open] = await fitForests(binned, [{ outcome: "open", label }], { settings: config.trees, seed: 1, workers: 2 });
 * open.forest.trees.length; // at most settings.count
 */
export async function fitForests(
  binned: BinnedFeatures,
  targets: readonly ForestTarget[],
  options: FitForestsOptions,
): Promise<FittedForest[]> {
  checkForestInputs(binned, targets, options);
  const { settings } = options;
  const n = binned.rowCount;
  const started = performance.now();
  const timestamp = options.timestamp ?? null;
  const validation = chooseValidationRows(n, settings.validationFraction, timestamp, options.seed);
  const trainRows = rowsWhere(validation, 0, n);
  const weight = options.weight ?? null;
  const positions = trainPositions(validation, n);

  const histSize = SLOT_VALUES * COLUMN_SLOTS * binned.columnCount;
  const budget = Math.max(2, Math.floor(BLOCK_HISTOGRAM_BYTES / (8 * Math.max(1, histSize))));
  // Blocks grow when histograms are large, so that the root's blocks fit the budget.
  const blockRows = Math.max(options.blockRows ?? DEFAULT_BLOCK_ROWS, Math.ceil(n / (budget - 1)));
  const rootBlocks = Math.max(1, Math.ceil(n / blockRows));
  const levelNodes = Math.min(2 ** (settings.depth - 1), settings.leaves);
  const histogramBlocks = Math.min(budget, rootBlocks + levelNodes);
  const buffers = createTrainingBuffers(binned.bins, {
    rowCount: n,
    columnCount: binned.columnCount,
    blockRows,
    hasWeight: weight !== null,
    hasValidation: validation !== null,
    sampleRows: settings.rowFraction < 1,
    maxDepth: settings.depth,
    histogramBlocks,
    segments: Math.min(n, rootBlocks * levelNodes) + 1,
    lossBlocks: lossBlocks(n),
    webAssembly: options.javascriptKernels !== true,
  });
  if (buffers.weight !== null && weight !== null) buffers.weight.set(weight);
  if (buffers.validation !== null && validation !== null) buffers.validation.set(validation);

  const pool = new TreeTaskPool(buffers, options.workers);
  const layout = {
    columnCount: binned.columnCount,
    valueBins: binned.valueBins,
    columnCategorical: binned.columnCategorical,
  };
  const grower = new TreeGrower(buffers, pool, layout, settings, histogramBlocks);
  const results: FittedForest[] = [];
  let treesDone = 0;
  const checkpoint = options.checkpoint;
  const resume = checkCheckpointTargets(checkpoint?.resume ?? null, targets);
  const progress: ForestProgress[] = [...resume];
  const schedule =
    checkpoint === undefined
      ? null
      : new CheckpointSchedule(checkpoint.everyTrees, checkpoint.everySeconds);
  try {
    for (let f = 0; f < targets.length; f++) {
      const target = targets[f];
      const onTree = (t: number, trainLoss: number, validationLoss: number | null): void => {
        treesDone++;
        const elapsedSeconds = (performance.now() - started) / 1000;
        const left = (targets.length - f) * settings.count - (t + 1);
        options.onProgress?.({
          outcome: target.outcome,
          forest: f + 1,
          forests: targets.length,
          tree: t + 1,
          trees: settings.count,
          trainLoss,
          validationLoss,
          elapsedSeconds,
          secondsLeft: (elapsedSeconds / treesDone) * left,
        });
      };
      const run = {
        binned,
        buffers,
        pool,
        grower,
        settings,
        trainRows,
        validation,
        weight,
        positions: settings.rowFraction < 1 ? null : positions,
        returnScores: options.returnScores === true,
        onTree,
        afterTree:
          checkpoint === undefined || schedule === null
            ? undefined
            : async (forest: ForestProgress): Promise<void> => {
                progress[f] = forest;
                if (schedule.advance(1)) await checkpoint.save(progress.slice(0, f + 1));
              },
      };
      const random = new SeededRandom(options.seed).fork(1000 + f);
      results.push(await fitOneForest(run, target, random, resume[f] ?? null));
    }
  } finally {
    await pool.close();
  }
  return results;
}
