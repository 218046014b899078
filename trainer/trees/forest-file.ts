import type { FeatureContract } from "../../scorer/model-types.js";
import type { TreeSettings } from "../schema/load-training-config.js";
import type { BinnedFeatures } from "./binned-features.js";
import type { FittedForest } from "./fit-forests.js";

/** The `format` and `version` every forest file carries. */
export const FOREST_FILE_FORMAT = "leafcast-forests";
export const FOREST_FILE_VERSION = 1;

/** A fitted forest as saved: everything but the training scores. */
export type ForestRecord = Omit<FittedForest, "scores">;

/**
 * The forests of one fitting run with what later stages need: the feature
 * contract the trees index, the numeric bin edges (to bin new data the same
 * way), the settings and seed (to fit again), and per forest its per-tree
 * losses and feature importance.
 *
 * @example
 * const file = forestFileOf(binned, fitted, config.trees, config.seed);
 * await writeForestFile("runs/demo/forests.json", file);
 */
export interface ForestFile {
  readonly seed: number;
  readonly settings: TreeSettings;
  readonly contract: FeatureContract;
  /** Per numeric feature: its upper bin edges (the last is Number.MAX_VALUE). */
  readonly binEdges: ReadonlyMap<string, Float64Array>;
  readonly forests: readonly ForestRecord[];
}

/**
 * Gathers a fitting run into a ForestFile.
 *
 * @example
 * forestFileOf(binned, fitted, config.trees, config.seed).forests.length; // one per outcome
 */
export function forestFileOf(
  binned: BinnedFeatures,
  fitted: readonly FittedForest[],
  settings: TreeSettings,
  seed: number,
): ForestFile {
  const binEdges = new Map<string, Float64Array>();
  binned.contract.numeric.forEach((name, c) => binEdges.set(name, binned.edges[c] as Float64Array));
  return {
    seed,
    settings,
    contract: binned.contract,
    binEdges,
    forests: fitted.map(({ scores: _scores, ...record }) => record),
  };
}
