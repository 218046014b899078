/**
 * An invented Plotline report input for the report tests: six outcome heads scored on
 * synthetic rows through the real metrics functions, a freshness study, leaf PSI from
 * synthetic leaf counts, importance, pruning and latency figures. Some user strings are
 * hostile on purpose (HOSTILE_*), to prove they are shown as text.
 */
import { leafPsi } from "../../trainer/metrics/leaf-psi.js";
import { reliabilityBins } from "../../trainer/metrics/reliability-bins.js";
import { staleness } from "../../trainer/metrics/staleness.js";
import { summarizeOutcome } from "../../trainer/metrics/summarize-outcome.js";
import type {
  ForestPsiSeries,
  FreshnessFigure,
  FreshnessRecovery,
  HeadReport,
  ReportInput,
} from "../../trainer/report/report-input.js";
import { testRandom } from "../trees/tree-test-helpers.js";

/** A segment value that would run a script if it reached the page unescaped. */
export const HOSTILE_SEGMENT = `<script>console.error("injected segment")</script>`;
/** A feature name that would load an image and run a handler if unescaped. */
export const HOSTILE_FEATURE = `<img src=x onerror="console.error('injected feature')">`;

const OUTCOMES: readonly [string, number][] = [
  ["open", 0.3],
  ["react", 0.08],
  ["reply", 0.03],
  ["save", 0.02],
  ["reshare", 0.012],
  ["hide", 0.006],
];
const POST_TYPES = ["harvest photo", "pest question", "seed swap", HOSTILE_SEGMENT];
const WINDOWS = ["05-06", "05-07", "05-08", "05-09", "05-10", "05-11", "05-12", "05-13"];
const FEATURES = [
  "tie_strength",
  "post_age_hours",
  "plot_size_m2",
  "author_followers",
  "photo_count",
  "comment_count",
  "distance_km",
  "season_week",
  "crop_family",
  "post_type",
  "viewer_tenure_days",
  HOSTILE_FEATURE,
];

function head(outcome: string, rate: number, random: () => number): HeadReport {
  const n = 2000;
  const predicted = new Float64Array(n);
  const label = new Uint8Array(n);
  const segment = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    segment[i] = Math.floor(random() * POST_TYPES.length);
    const p = Math.min(0.95, rate * Math.exp(3 * (random() - 0.5) + 0.3 * (segment[i] - 1.5)));
    predicted[i] = p;
    // A little over-confidence at the top, so the reliability diagram bends.
    label[i] = random() < p * (p > 2 * rate ? 0.85 : 1.05) ? 1 : 0;
  }
  const subset = (code: number) => {
    const rows = [...segment.keys()].filter((i) => segment[i] === code);
    return summarizeOutcome(
      Float64Array.from(rows, (i) => predicted[i]),
      Uint8Array.from(rows, (i) => label[i]),
      rate,
    );
  };
  return {
    outcome,
    trainingRate: rate,
    overall: summarizeOutcome(predicted, label, rate),
    reliability: reliabilityBins(predicted, label, 20),
    baselines: [
      {
        name: "training positive rate",
        summary: summarizeOutcome(new Float64Array(n).fill(rate), label, rate),
      },
    ],
    segments: {
      column: "post_type",
      groups: POST_TYPES.map((value, code) => ({ value, summary: subset(code) })),
    },
  };
}

function freshness(): { figures: FreshnessFigure[]; recovery: FreshnessRecovery[] } {
  const figures: FreshnessFigure[] = [];
  const recovery: FreshnessRecovery[] = [];
  OUTCOMES.forEach(([outcome], o) => {
    const sums = { frozen: 0, "heads-updated": 0, "trees-refit": 0 };
    WINDOWS.forEach((_, w) => {
      // Base-rate drift from window 3; a new post type from window 5 only a refit learns.
      const drift = w >= 3 ? 0.02 * (w - 2) : 0;
      const newType = w >= 5 ? 0.015 : 0;
      const base = 0.86 + 0.015 * o;
      const arms = {
        frozen: { ne: base + drift + newType, calibration: 1 - 1.5 * drift },
        "heads-updated": {
          ne: base + (0.1 + 0.02 * o) * drift + newType,
          calibration: 1 - 0.2 * drift,
        },
        "trees-refit": { ne: base + 0.1 * drift, calibration: 1 - 0.1 * drift },
      } as const;
      for (const arm of ["frozen", "heads-updated", "trees-refit"] as const) {
        figures.push({ outcome, arm, window: w, ...arms[arm] });
        if (w >= 3) sums[arm] += arms[arm].ne / (WINDOWS.length - 3);
      }
    });
    recovery.push({
      outcome,
      frozenNe: sums.frozen,
      headsUpdatedNe: sums["heads-updated"],
      treesRefitNe: sums["trees-refit"],
    });
  });
  return { figures, recovery };
}

function psiSeries(forest: string, trees: number, random: () => number): ForestPsiSeries {
  const leaves = 8;
  const fit = new Float64Array(trees * leaves);
  for (let i = 0; i < fit.length; i++) fit[i] = 200 + Math.floor(random() * 400);
  const perWindow = WINDOWS.map((_, w) => {
    const now = new Float64Array(fit.length);
    for (let t = 0; t < trees; t++) {
      // Later windows move rows into the last leaf of some trees: the new post type.
      const shift = w >= 5 && t % 3 === 0 ? 0.6 * (w - 4) : 0.02 * w;
      for (let l = 0; l < leaves; l++) {
        const k = t * leaves + l;
        now[k] = fit[k] * (0.9 + 0.2 * random()) * (l === leaves - 1 ? 1 + 3 * shift : 1);
      }
    }
    return leafPsi(fit, now, leaves);
  });
  return { forest, perWindow };
}

/** The full fixture: every section present. */
export function plotlineReportInput(): ReportInput {
  const random = testRandom(20240506);
  const heads = OUTCOMES.map(([outcome, rate]) => head(outcome, rate, random));
  const forests = [
    psiSeries("open", 40, random),
    psiSeries("reply", 40, random),
    psiSeries("hide", 24, random),
  ];
  const latest = Object.fromEntries(
    forests.map((f) => [f.forest, f.perWindow[f.perWindow.length - 1].forest]),
  );
  const verdict = staleness(latest, 0.2);
  return {
    title: "Plotline engagement: May replay",
    subtitle: "fixture data, invented",
    details: [
      { name: "data", value: "plotline-may.parquet (invented)" },
      { name: "rows", value: "12,000" },
    ],
    findings: [
      "Head updates recover most of the NE lost to the base-rate drift.",
      `The new post type ${HOSTILE_SEGMENT} leaves a gap that only refitting closes.`,
    ],
    heads,
    freshness: { windows: WINDOWS, windowUnit: "day", ...freshness() },
    staleness: { windows: WINDOWS, forests, threshold: 0.2, verdict },
    importance: ["reply", "save"].map((forest, f) => ({
      forest,
      features: FEATURES.map((feature, i) => {
        const used = i < 9 - f;
        const weight = used ? (FEATURES.length - i) ** 2 * (1 + random()) : 0;
        return {
          feature,
          gain: weight * 120,
          cover: used ? weight * 35 + 400 * random() : 0,
          splits: used ? Math.max(1, Math.round(weight / 3)) : 0,
        };
      }),
    })),
    pruning: {
      steps: [12, 10, 8, 6, 4].map((kept, s) => ({
        featuresKept: kept,
        heldOutNe: {
          reply: 0.902 + (kept < 8 ? 0.01 * (8 - kept) : 0.0005 * s),
          save: 0.915 + (kept < 6 ? 0.02 : 0.001 * s),
        },
        dropped:
          s === 0 ? [] : FEATURES.slice(FEATURES.length - 2 * s, FEATURES.length - 2 * s + 2),
      })),
      schemaPath: "runs/may/schema-pruned.json",
    },
    latency: {
      description: "one item, 120 trees of depth 6, 6 heads (invented figures)",
      perItem: { p50: 820, p90: 960, p99: 2100, p999: 9400, max: 61000, calls: 200000 },
      batches: [
        { batchSize: 1, nsPerItem: 790 },
        { batchSize: 16, nsPerItem: 520 },
        { batchSize: 256, nsPerItem: 410 },
        { batchSize: 4096, nsPerItem: 395 },
      ],
    },
  };
}
