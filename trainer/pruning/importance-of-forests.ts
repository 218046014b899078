import type { FeatureImportance } from "../trees/feature-importance.js";

/** One forest's importance: the outcome it predicts and every feature it was given. */
export interface ForestImportanceOf {
  readonly forest: string;
  readonly features: readonly FeatureImportance[];
}

/** A feature's importance over every forest of a fit. */
export interface CombinedImportance extends FeatureImportance {
  /**
   * The mean over forests of the feature's share of that forest's total gain (0..1).
   * Gains of forests for different outcomes are on different scales (a rare outcome's
   * hessians, and so its gains, are small), so each forest counts once.
   */
  readonly gainShare: number;
  /** Forests with at least one split on the feature. */
  readonly forestsUsing: number;
}

/** Importance by gain, cover and split count, per forest and combined. */
export interface ImportanceOfForests {
  /** Per forest, features in the order given (the report's ForestImportance fits as is). */
  readonly perForest: readonly ForestImportanceOf[];
  /** Every feature of any forest, strongest first: by gainShare, then splits, then name. */
  readonly combined: readonly CombinedImportance[];
  /** Features that no tree of any forest splits on, in the order given. */
  readonly unused: readonly string[];
}

/**
 * Gathers the importance of the forests of one fit (FittedForest.importance or a
 * forest file's ForestRecord.importance): per forest as given, combined over
 * forests (gain, cover and splits summed; gainShare as the mean per-forest share),
 * and the features no tree uses.
 *
 * @example
 * const { combined, unused } = importanceOfForests(
 *   forestFile.forests.map((f) => ({ forest: f.forest.outcome, features: f.importance })),
 * );
 * combined[0].feature; // the feature that earns the most gain
 * unused; // e.g. ["noise_a"]
 */
export function importanceOfForests(forests: readonly ForestImportanceOf[]): ImportanceOfForests {
  const index = new Map<string, number>();
  const names: string[] = [];
  for (const forest of forests) {
    for (const f of forest.features) {
      if (!index.has(f.feature)) {
        index.set(f.feature, names.length);
        names.push(f.feature);
      }
    }
  }
  const n = names.length;
  const gain = new Float64Array(n);
  const cover = new Float64Array(n);
  const splits = new Float64Array(n);
  const share = new Float64Array(n);
  const using = new Int32Array(n);
  for (const forest of forests) {
    let total = 0;
    for (const f of forest.features) total += f.gain;
    for (const f of forest.features) {
      const i = index.get(f.feature) as number;
      gain[i] += f.gain;
      cover[i] += f.cover;
      splits[i] += f.splits;
      if (f.splits > 0) using[i]++;
      if (total > 0) share[i] += f.gain / total / forests.length;
    }
  }
  const combined = names.map((feature, i): CombinedImportance => ({
    feature,
    gain: gain[i],
    cover: cover[i],
    splits: splits[i],
    gainShare: share[i],
    forestsUsing: using[i],
  }));
  combined.sort(
    (a, b) =>
      b.gainShare - a.gainShare ||
      b.splits - a.splits ||
      (a.feature < b.feature ? -1 : a.feature > b.feature ? 1 : 0),
  );
  return {
    perForest: forests.map((f) => ({ forest: f.forest, features: f.features })),
    combined,
    unused: names.filter((_, i) => splits[i] === 0),
  };
}
