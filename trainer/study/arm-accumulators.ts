import type { CategoryDictionary } from "../data/category-dictionary.js";
import { MetricAccumulator } from "../metrics/metric-accumulator.js";
import type { FreshnessArm } from "../report/report-input.js";
import { windowFigure, type SegmentWindowFigure, type WindowFigure } from "./window-figure.js";

/** The arms in the order they are scored and drawn. */
const ARMS: readonly FreshnessArm[] = ["frozen", "heads-updated", "trees-refit"];

/**
 * The metric accumulators of one window: one per (arm, outcome), with segments
 * when the study breaks figures down by a column. Only sums are kept, so AUC
 * histograms are small (the freshness figures use NE and calibration).
 *
 * @example
 * const window = new ArmAccumulators(["open"], true);
 * window.of("frozen").get("open")?.add(p, y, { segment });
 * window.figures(3, rates, dictionary).figures[0].ne;
 */
export class ArmAccumulators {
  private readonly byArm: ReadonlyMap<FreshnessArm, ReadonlyMap<string, MetricAccumulator>>;

  constructor(outcomes: readonly string[], bySegment: boolean) {
    this.byArm = new Map(
      ARMS.map((arm) => [
        arm,
        new Map(
          outcomes.map((o) => [
            o,
            new MetricAccumulator({ aucBins: 1 << 10, groupAucBins: 1 << 8, bySegment }),
          ]),
        ),
      ]),
    );
  }

  /** Per outcome, the accumulator of `arm`. */
  of(arm: FreshnessArm): ReadonlyMap<string, MetricAccumulator> {
    return this.byArm.get(arm) ?? new Map();
  }

  /** The window's figures, all rows and (given the segment dictionary) per segment value. */
  figures(
    window: number,
    trainingRate: ReadonlyMap<string, number>,
    dictionary: CategoryDictionary | undefined,
  ): { figures: WindowFigure[]; segmentFigures: SegmentWindowFigure[] } {
    const figures: WindowFigure[] = [];
    const segmentFigures: SegmentWindowFigure[] = [];
    for (const [arm, accumulators] of this.byArm) {
      for (const [outcome, acc] of accumulators) {
        const rate = trainingRate.get(outcome) ?? Number.NaN;
        figures.push(windowFigure(outcome, arm, window, acc.overall(rate).summary));
        if (dictionary === undefined) continue;
        for (const g of acc.segments(rate)) {
          const segment = g.code < 0 ? "(missing)" : dictionary.valueOf(g.code);
          segmentFigures.push({ ...windowFigure(outcome, arm, window, g.summary), segment });
        }
      }
    }
    return { figures, segmentFigures };
  }
}
