import { LeafcastError, type Issue } from "../../trainer/errors.js";
import { PLOTLINE_OUTCOMES, type PlotlineOutcome } from "./plotline-vocabulary.js";

/** What a Plotline run looks like; every field has a default. */
export interface PlotlineOptions {
  /** Any safe integer; the same seed and options give the same rows, byte for byte. Default 1. */
  seed?: number;
  /** Days of impressions. Default 42. */
  days?: number;
  /** Impressions per day. Default 50,000. Ignored when `rows` is given. */
  rowsPerDay?: number;
  /** Total impressions, spread as evenly as possible over the days. */
  rows?: number;
  /** The first day, "YYYY-MM-DD", starting at midnight UTC. Default "2025-06-02" (early summer). */
  startDate?: string;
  /** The day (1-based) from which plot tours are posted; null: never. Default 22. */
  newPostTypeDay?: number | null;
  /** The day (1-based) from which the new feed layout is live; null: never. Default 29. */
  layoutChangeDay?: number | null;
  /** Added to each outcome's logit from the layout day on. Default open +0.3, react +0.1, save +0.15, reshare -0.1, hide -0.2. */
  layoutShift?: Partial<Record<PlotlineOutcome, number>>;
  /** Authors (author_id cardinality). Default 5,000. */
  authors?: number;
  /** Viewers (viewer_id cardinality). Default 50,000. */
  viewers?: number;
  /** Rows per generated chunk. Default 65,536. */
  chunkRows?: number;
}

/** Options with every default filled in and checked. */
export interface ResolvedPlotlineOptions {
  readonly seed: number;
  readonly days: number;
  readonly rows: number;
  readonly startDate: string;
  /** Midnight UTC of the first day, in epoch seconds. */
  readonly startSeconds: number;
  /** 0-based first day index of plot tours; `days` when never. */
  readonly newPostTypeIndex: number;
  /** 0-based first day index of the new layout; `days` when never. */
  readonly layoutChangeIndex: number;
  /** Logit shift per outcome, in PLOTLINE_OUTCOMES order. */
  readonly layoutShift: Float64Array;
  readonly authors: number;
  readonly viewers: number;
  readonly chunkRows: number;
}

const DEFAULT_SHIFT: Record<PlotlineOutcome, number> = {
  open: 0.3,
  react: 0.1,
  reply: 0,
  save: 0.15,
  reshare: -0.1,
  hide: -0.2,
};

/**
 * Fills in defaults and checks every option, reporting all problems at once.
 *
 * @example
 * resolvePlotlineOptions({ days: 7, rowsPerDay: 1000 }).rows; // 7000
 */
export function resolvePlotlineOptions(options: PlotlineOptions = {}): ResolvedPlotlineOptions {
  const issues: Issue[] = [];
  const whole = (name: string, value: number, min: number, max: number): number => {
    if (!Number.isSafeInteger(value) || value < min || value > max) {
      issues.push({
        code: "bad_option",
        message: `option "${name}" expected a whole number from ${min} to ${max}, found ${value}`,
      });
    }
    return value;
  };
  const seed = whole("seed", options.seed ?? 1, Number.MIN_SAFE_INTEGER, Number.MAX_SAFE_INTEGER);
  const days = whole("days", options.days ?? 42, 1, 3650);
  const rows =
    options.rows !== undefined
      ? whole("rows", options.rows, 0, 2 ** 31 - 1)
      : whole("rowsPerDay", options.rowsPerDay ?? 50_000, 0, 2 ** 31 - 1) * days;
  if (rows > 2 ** 31 - 1) {
    issues.push({ code: "bad_option", message: `expected at most 2^31 - 1 rows, found ${rows}` });
  }
  const startDate = options.startDate ?? "2025-06-02";
  const startMs = /^\d{4}-\d{2}-\d{2}$/.test(startDate)
    ? Date.parse(`${startDate}T00:00:00Z`)
    : NaN;
  if (Number.isNaN(startMs) || new Date(startMs).toISOString().slice(0, 10) !== startDate) {
    issues.push({
      code: "bad_option",
      message: `option "startDate" expected a date "YYYY-MM-DD", found ${JSON.stringify(startDate)}`,
    });
  }
  const dayIndex = (name: string, value: number | null | undefined, fallback: number): number => {
    const day = value === undefined ? fallback : value;
    if (day === null) return days;
    return whole(name, day, 1, 100_000) - 1;
  };
  const newPostTypeIndex = Math.min(days, dayIndex("newPostTypeDay", options.newPostTypeDay, 22));
  const layoutChangeIndex = Math.min(
    days,
    dayIndex("layoutChangeDay", options.layoutChangeDay, 29),
  );
  const layoutShift = Float64Array.from(PLOTLINE_OUTCOMES, (outcome) => {
    const shift = options.layoutShift?.[outcome] ?? DEFAULT_SHIFT[outcome];
    if (!Number.isFinite(shift) || Math.abs(shift) > 5) {
      issues.push({
        code: "bad_option",
        message: `option "layoutShift.${outcome}" expected a number from -5 to 5, found ${shift}`,
      });
    }
    return shift;
  });
  for (const key of Object.keys(options.layoutShift ?? {})) {
    if (!(PLOTLINE_OUTCOMES as readonly string[]).includes(key)) {
      issues.push({
        code: "bad_option",
        message: `option "layoutShift" expected keys ${PLOTLINE_OUTCOMES.join(", ")}, found "${key}"`,
      });
    }
  }
  const authors = whole("authors", options.authors ?? 5000, 12, 99_999);
  const viewers = whole("viewers", options.viewers ?? 50_000, 1, 999_999);
  const chunkRows = whole("chunkRows", options.chunkRows ?? 65_536, 1, 1 << 22);
  if (issues.length > 0) throw new LeafcastError("plotline", issues);
  return {
    seed,
    days,
    rows,
    startDate,
    startSeconds: startMs / 1000,
    newPostTypeIndex,
    layoutChangeIndex,
    layoutShift,
    authors,
    viewers,
    chunkRows,
  };
}
