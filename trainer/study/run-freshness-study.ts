import type { Scorer } from "../../scorer/scorer.js";
import type { CategoryDictionary } from "../data/category-dictionary.js";
import type { HeadState } from "../heads/head-state.js";
import { MetricAccumulator } from "../metrics/metric-accumulator.js";
import { learnHeadsFromFiles } from "../pipeline/learn-heads-from-files.js";
import type {
  ForestImportance,
  FreshnessArm,
  FreshnessRecovery,
  HeadReport,
  StalenessReport,
} from "../report/report-input.js";
import type { ResolvedSchema } from "../schema/load-dataset-schema.js";
import type { ResolvedTrainingConfig } from "../schema/load-training-config.js";
import { fitTreesFromFile } from "../trees/fit-trees-from-file.js";
import type { ForestFile } from "../trees/forest-file.js";
import { ArmAccumulators } from "./arm-accumulators.js";
import { checkStudyOptions } from "./check-study-options.js";
import { checkTrainingRates } from "./check-training-rates.js";
import { forestStaleness } from "./forest-staleness.js";
import { freshnessRecovery } from "./freshness-recovery.js";
import { hybridScorer } from "./hybrid-scorer.js";
import { planStudyWindows, type StudyPlanOptions, type StudyWindow } from "./plan-study-windows.js";
import { scoreWindow, type WindowTarget } from "./score-window.js";
import { spanLabel } from "./span-label.js";
import { LeafcastError } from "../errors.js";
import { segmentGapFindings } from "./segment-gap-findings.js";
import { studyFindings } from "./study-findings.js";
import { studyHeadReports, type StudyBaseline } from "./study-head-reports.js";
import { treesOnlyScorer } from "./trees-only-scorer.js";
import type { SegmentWindowFigure, WindowFigure } from "./window-figure.js";

export type { SegmentWindowFigure, WindowFigure } from "./window-figure.js";

export interface FreshnessStudyOptions extends StudyPlanOptions {
  /**
   * 1-based number of the first day file of the drift: the recovery averages the
   * windows that start on or after it. Default: every scored window.
   */
  readonly driftFromDay?: number;
  /** Forest leaf PSI at which the trees should be refit; default 0.25. */
  readonly psiThreshold?: number;
  /** Also score the baselines "trees only" and "heads on hashed ids only"; default true. */
  readonly baselines?: boolean;
  /** A categorical column to break the figures down by, e.g. "post_type". */
  readonly segmentColumn?: string | null;
  /** Worker threads of the heads (default config.workers; 0 learns on this thread). */
  readonly workers?: number;
  readonly badRows?: "fail" | "skip";
  /** One line per step, for people watching. */
  readonly log?: (line: string) => void;
  readonly signal?: AbortSignal;
}

/** Everything the study measured. */
export interface FreshnessStudy {
  readonly fitFiles: readonly string[];
  readonly fitLabel: string;
  /** Rows read from the fit span. */
  readonly fitRows: number;
  readonly windows: readonly StudyWindow[];
  /** Outcomes of the heads, in head order. */
  readonly outcomes: readonly string[];
  /** Per outcome, the positive rate of the fit span: every NE of the study is against it. */
  readonly trainingRate: ReadonlyMap<string, number>;
  readonly figures: readonly WindowFigure[];
  /** With a segment column: the same figures per value of it (e.g. the new post type's rows alone). */
  readonly segmentFigures: readonly SegmentWindowFigure[];
  /** Indexes of the windows the recovery averages. */
  readonly recoveryWindows: readonly number[];
  readonly recovery: readonly FreshnessRecovery[];
  readonly staleness: StalenessReport;
  /** The deployed arm (frozen trees, heads updated) over every scored row, with baselines. */
  readonly heads: readonly HeadReport[];
  readonly importance: readonly ForestImportance[];
  readonly findings: readonly string[];
  /** The trees fit on the fit span, and the heads over them updated through the last window. */
  readonly forests: ForestFile;
  readonly headState: HeadState;
  readonly rowsScored: number;
}

/**
 * The freshness study: replays day files in windows and scores every window,
 * outcome by outcome, with three arms, none of which has learned from the day
 * it is scored on: (a) "frozen": trees and heads fit on the fit span; (b)
 * "heads-updated": the same trees, heads updated day by day, each day file
 * scored before they learn it; (c) "trees-refit": trees refit and heads learned
 * afresh on the files before the window (see refitDays), once per window. Per
 * (outcome, arm, window) it keeps NE, calibration, log loss and rows. Every NE divides by the entropy of the fit span's positive rate
 * (He et al. 2014's training rate), one reference for all arms and windows, so
 * arms differ by log loss alone and the recovery shares are shares of log loss.
 * It also measures the frozen trees' leaf PSI per window (tree staleness), the
 * deployed arm's figures over all scored rows beside baselines, and writes
 * findings in plain sentences.
 *
 * @example
 * const study = await runFreshnessStudy(days, schema, config, { windowDays: 7, fitDays: 7, driftFromDay: 22 });
 * study.findings[0]; // "head updates recover 84 % of the NE lost to drift for open; ..."
 */
export async function runFreshnessStudy(
  files: readonly string[],
  schema: ResolvedSchema,
  config: ResolvedTrainingConfig,
  options: FreshnessStudyOptions,
): Promise<FreshnessStudy> {
  const plan = planStudyWindows(files, options);
  checkStudyOptions(schema, options);
  // A drift day after the last window's start would leave nothing to average: refuse it before any work.
  const lastWindow = plan.windows[plan.windows.length - 1];
  if (options.driftFromDay !== undefined && options.driftFromDay > lastWindow.firstDay) {
    throw new LeafcastError("study", [
      {
        code: "bad_option",
        message: `drift day expected at most ${lastWindow.firstDay} (the first day of the last scored window), found ${options.driftFromDay}`,
      },
    ]);
  }
  const log = options.log ?? ((): void => undefined);
  const segmentColumn = options.segmentColumn ?? null;
  const read = { badRows: options.badRows, signal: options.signal };
  const heads = { ...read, workers: options.workers };

  log(`fit: trees and heads on ${plan.fitLabel} (${plan.fitFiles.length} files)`);
  const fitted = await fitTreesFromFile(plan.fitFiles, schema, config, read);
  const learned = await learnHeadsFromFiles(plan.fitFiles, schema, config, fitted.forests, heads);
  const state = learned.state;
  const outcomes = state.info.outcomes;
  const trainingRate = new Map(learned.report.map((h) => [h.outcome, h.overall.positiveRate]));
  checkTrainingRates(trainingRate, plan.fitLabel);
  const frozen = hybridScorer(fitted.forests, state);
  const baselines = options.baselines ?? true;
  const treesOnly = baselines ? treesOnlyScorer(fitted.forests, state) : null;
  const hashedForests: ForestFile = { ...fitted.forests, forests: [] };
  const hashed = baselines
    ? (await learnHeadsFromFiles(plan.fitFiles, schema, config, hashedForests, heads)).state
    : null;

  const dictionaries = new Map<string, CategoryDictionary>();
  const scoreOptions = { ...read, batchRows: config.batchRows, dictionaries, segmentColumn };
  const fitCounts = new Float64Array(frozen.layout.leafCount);
  await scoreWindow(plan.fitFiles, schema, [], {
    ...scoreOptions,
    leafCounts: { scorer: frozen, counts: fitCounts },
  });

  // The heads section's accumulators run over every scored window.
  const overall = (names: readonly string[]): Map<string, MetricAccumulator> =>
    new Map(names.map((o) => [o, new MetricAccumulator({ bySegment: segmentColumn !== null })]));
  const deployed = overall(outcomes);
  const rateBaseline = { name: "training positive rate", sinks: overall(outcomes) };
  const treesBaseline =
    treesOnly === null ? null : { name: "trees only", sinks: overall(treesOnly.outcomes) };
  const hashedBaseline =
    hashed === null ? null : { name: "heads on hashed ids only", sinks: overall(outcomes) };
  const baselineSinks = [rateBaseline, treesBaseline, hashedBaseline].filter(
    (b): b is StudyBaseline & { sinks: Map<string, MetricAccumulator> } => b !== null,
  );

  const figures: WindowFigure[] = [];
  const segmentFigures: SegmentWindowFigure[] = [];
  const windowCounts: Float64Array[] = [];
  let rowsScored = 0;
  for (const [w, window] of plan.windows.entries()) {
    const started = performance.now();
    const arms = new ArmAccumulators(outcomes, segmentColumn !== null);
    const refit = await refitArm(window);
    const counts = new Float64Array(frozen.layout.leafCount);
    let rows = 0;
    // Day by day, as heads are refreshed in production: every arm scores the day,
    // then the updated heads (and the hashed-ids baseline) learn it.
    for (const day of window.files) {
      const targets: WindowTarget[] = [
        { scorer: frozen, sinks: sinksOf(arms.of("frozen")) },
        {
          scorer: hybridScorer(fitted.forests, state),
          sinks: sinksOf(arms.of("heads-updated"), deployed),
        },
        { scorer: refit, sinks: sinksOf(arms.of("trees-refit")) },
        { scorer: null, constant: trainingRate, sinks: sinksOf(rateBaseline.sinks) },
      ];
      if (treesOnly !== null && treesBaseline !== null)
        targets.push({ scorer: treesOnly, sinks: sinksOf(treesBaseline.sinks) });
      if (hashed !== null && hashedBaseline !== null)
        targets.push({
          scorer: hybridScorer(hashedForests, hashed),
          sinks: sinksOf(hashedBaseline.sinks),
        });
      rows += await scoreWindow([day], schema, targets, {
        ...scoreOptions,
        leafCounts: { scorer: frozen, counts },
      });
      await learnHeadsFromFiles([day], schema, config, fitted.forests, { ...heads, state });
      if (hashed !== null)
        await learnHeadsFromFiles([day], schema, config, hashedForests, {
          ...heads,
          state: hashed,
        });
    }
    rowsScored += rows;
    windowCounts.push(counts);
    const dictionary = segmentColumn === null ? undefined : dictionaries.get(segmentColumn);
    const scored = arms.figures(w, trainingRate, dictionary);
    figures.push(...scored.figures);
    segmentFigures.push(...scored.segmentFigures);
    const seconds = ((performance.now() - started) / 1000).toFixed(1);
    log(
      `window ${window.label}: ${rows} rows; NE frozen/heads updated/trees refit: ${neLine(scored.figures, outcomes)} (${seconds} s)`,
    );
  }

  const driftFrom = options.driftFromDay ?? plan.windows[0].firstDay;
  const recoveryWindows = plan.windows.flatMap((win, w) => (win.firstDay >= driftFrom ? [w] : []));
  const recovery = freshnessRecovery(figures, outcomes, recoveryWindows);
  const staleness = forestStaleness(
    fitted.forests.forests.map((f) => f.forest),
    frozen.layout,
    fitCounts,
    windowCounts,
    plan.windows.map((win) => win.label),
    options.psiThreshold ?? 0.25,
  );
  const first = plan.windows[recoveryWindows[0]];
  const last = plan.windows[recoveryWindows[recoveryWindows.length - 1]];
  const recoverySpan = first === undefined ? "no window" : spanLabel(first.firstDay, last.lastDay);
  const segmentDictionary = segmentColumn === null ? undefined : dictionaries.get(segmentColumn);
  return {
    fitFiles: plan.fitFiles,
    fitLabel: plan.fitLabel,
    fitRows: fitted.rowsRead,
    windows: plan.windows,
    outcomes,
    trainingRate,
    figures,
    segmentFigures,
    recoveryWindows,
    recovery,
    staleness,
    heads: studyHeadReports(
      outcomes,
      trainingRate,
      deployed,
      baselineSinks,
      segmentColumn,
      segmentDictionary,
    ),
    importance: fitted.forests.forests.map((f) => ({
      forest: f.forest.outcome,
      features: f.importance,
    })),
    findings: studyFindings({
      recovery,
      recoverySpan,
      staleness,
      segmentGaps:
        segmentColumn === null
          ? []
          : segmentGapFindings({
              segmentFigures,
              segmentColumn,
              windows: recoveryWindows,
              span: recoverySpan,
            }),
    }),
    forests: fitted.forests,
    headState: state,
    rowsScored,
  };

  /** Arm (c) for one window: trees and heads learned afresh on the files before it. */
  async function refitArm(window: StudyWindow): Promise<Scorer> {
    const same =
      window.refitFiles.length === plan.fitFiles.length &&
      window.refitFiles.every((f, i) => f === plan.fitFiles[i]);
    // Same files, same seed: the fit span's model is exactly what a refit would give.
    if (same) return frozen;
    const trees = await fitTreesFromFile(window.refitFiles, schema, config, read);
    const fresh = await learnHeadsFromFiles(
      window.refitFiles,
      schema,
      config,
      trees.forests,
      heads,
    );
    return hybridScorer(trees.forests, fresh.state);
  }
}

/** Each outcome's own accumulator, plus the one of `also` when given. */
function sinksOf(
  own: ReadonlyMap<string, MetricAccumulator>,
  also?: ReadonlyMap<string, MetricAccumulator>,
): Map<string, MetricAccumulator[]> {
  return new Map(
    [...own].map(([o, acc]) => {
      const extra = also?.get(o);
      return [o, extra === undefined ? [acc] : [acc, extra]];
    }),
  );
}

/** "open 0.912/0.874/0.869  react ..." for the log line of a window. */
function neLine(figures: readonly WindowFigure[], outcomes: readonly string[]): string {
  const ne = (outcome: string, arm: FreshnessArm): string =>
    figures.find((f) => f.outcome === outcome && f.arm === arm)?.ne.toFixed(3) ?? "n/a";
  return outcomes
    .map((o) => `${o} ${ne(o, "frozen")}/${ne(o, "heads-updated")}/${ne(o, "trees-refit")}`)
    .join("  ");
}
