import { mkdir } from "node:fs/promises";
import { join } from "node:path";
import { writePlotlineDays } from "../../datasets/plotline/write-plotline-days.js";
import type { DataFormat } from "../data/write-columns.js";
import { inspectFile } from "../inspect/inspect-file.js";
import { loadDatasetSchema } from "../schema/load-dataset-schema.js";
import { plotlineSchemaPath } from "../package-root.js";
import { writeFileAtomic } from "../io/write-file-atomic.js";
import { resolveTrainingConfig } from "../schema/load-training-config.js";
import { fitTreesFromFile } from "../trees/fit-trees-from-file.js";
import { writeForestFile } from "../trees/write-forest-file.js";
import { summarizeForests } from "../trees/summarize-forests.js";
import { saveHeadState } from "../heads/save-head-state.js";
import type { HeadState } from "../heads/head-state.js";
import { learnHeadsFromFiles } from "../pipeline/learn-heads-from-files.js";
import { headReportSummary, renderHeadSummary } from "../pipeline/head-report-summary.js";
import { artifactInputOf } from "../pipeline/artifact-input-of.js";
import { scoreItemsFromFile } from "../pipeline/score-items-from-file.js";
import { exportArtifact } from "../artifact/export-artifact.js";
import { buildArtifact } from "../artifact/build-artifact.js";
import { latencyRow } from "../artifact/latency-row.js";
import { formatLatencyTable } from "../artifact/format-latency-table.js";

export interface DemoOptions {
  /** Folder for everything the demo writes. */
  readonly out: string;
  readonly days: number;
  readonly rowsPerDay: number;
  readonly seed: number;
  readonly format: DataFormat;
  /** Receives one line per step. */
  readonly log: (line: string) => void;
}

/** What the demo produced, for tests and for scripting. */
export interface DemoResult {
  readonly dataFiles: readonly string[];
  readonly rows: number;
  readonly forestsPath: string;
  readonly headsPath: string;
  readonly artifactPath: string;
}

/**
 * Value of each outcome in the combined ranking score. Hide weighs strongly
 * negative: a feed tuned to engagement alone would show what people then hide.
 */
export const demoValueWeights: Readonly<Record<string, number>> = {
  open: 1,
  react: 2,
  reply: 4,
  save: 3,
  reshare: 5,
  hide: -20,
};

/** The demo's training configuration, written beside its outputs so a reader can see and reuse it. */
export const demoConfig = {
  seed: 1,
  trees: { count: 60, depth: 6, learningRate: 0.1, validationFraction: 0.1, patience: 10 },
  heads: {
    alpha: 0.1,
    beta: 1,
    lambda1: 0.5,
    lambda2: 1,
    hashBits: 18,
    crosses: [["post_type", "garden_site"]],
  },
};

/** Days the trees are fitted on; the heads learn from them too, then update day by day. */
export const DEMO_FIT_DAYS = 7;

/**
 * The main job end to end on the built-in Plotline scenario: generate the logs,
 * read them against their schema, and (as the trainer grows) fit trees, learn
 * and update heads day by day, evaluate, export and time the scorer.
 *
 * @example
 * await runDemo({ out: "runs/demo", days: 14, rowsPerDay: 5000, seed: 1, format: "csv", log: console.log });
 */
export async function runDemo(options: DemoOptions): Promise<DemoResult> {
  const { log } = options;
  const dataDir = join(options.out, "data");
  await mkdir(dataDir, { recursive: true });

  log(
    `1. scenario: ${options.days} days x ${options.rowsPerDay} impressions of Plotline -> ${dataDir}`,
  );
  const started = performance.now();
  const written = await writePlotlineDays(dataDir, options.format, {
    seed: options.seed,
    days: options.days,
    rowsPerDay: options.rowsPerDay,
  });
  const rows = written.reduce((sum, w) => sum + w.rows, 0);
  log(`   wrote ${rows} rows in ${((performance.now() - started) / 1000).toFixed(1)} s`);

  const schema = await loadDatasetSchema(plotlineSchemaPath());
  const first = written[0];
  if (first !== undefined) {
    log(`2. inspect: ${first.path} against schema "${schema.name}"`);
    const report = await inspectFile(first.path, schema, { badRows: "fail" });
    const rates = report.columns
      .filter((c) => c.positiveRate !== undefined)
      .map((c) => `${c.name} ${(100 * (c.positiveRate ?? 0)).toFixed(2)} %`);
    log(
      `   ${report.stats.rowsAccepted} rows, ${report.stats.rowsRejected} rejected; outcome rates: ${rates.join(", ")}`,
    );
  }

  const configPath = join(options.out, "config.json");
  await writeFileAtomic(
    configPath,
    `${JSON.stringify({ ...demoConfig, seed: options.seed }, null, 2)}\n`,
  );
  const config = resolveTrainingConfig({ ...demoConfig, seed: options.seed }, configPath);
  const fitFiles = written.slice(0, DEMO_FIT_DAYS).map((w) => w.path);
  log(
    `3. fit-trees: forests on days 1-${fitFiles.length} (${config.trees.count} trees at most, depth ${config.trees.depth}, ${config.workers} workers)`,
  );
  const fitStarted = performance.now();
  const fitted = await fitTreesFromFile(fitFiles, schema, config);
  const forestsPath = join(options.out, "forests.json");
  await writeForestFile(forestsPath, fitted.forests);
  for (const f of summarizeForests(fitted.forests)) {
    const validation =
      f.validationLoss === null ? "" : `, validation ${f.validationLoss.toFixed(4)}`;
    log(
      `   ${f.outcome}: ${f.trees} trees, log loss ${f.startLoss.toFixed(4)} -> ${f.trainLoss.toFixed(4)}${validation}; top: ${f.topFeatures.slice(0, 3).join(", ")}`,
    );
  }
  log(
    `   ${fitted.rowsSampled} rows in ${((performance.now() - fitStarted) / 1000).toFixed(1)} s -> ${forestsPath}`,
  );

  log(
    `4. learn-heads: one FTRL-Proximal head per outcome on days 1-${fitFiles.length}, every row scored before it is learned`,
  );
  const headsDir = join(options.out, "heads");
  await mkdir(headsDir, { recursive: true });
  let learned = await learnHeadsFromFiles(fitFiles, schema, config, fitted.forests);
  let headsPath = join(headsDir, `heads-day-${String(fitFiles.length).padStart(2, "0")}.state`);
  await saveHeadState(headsPath, learned.state);
  log(renderHeadSummary(headReportSummary(learned.report)).replace(/^/gm, " "));

  const laterFiles = written.slice(DEMO_FIT_DAYS).map((w) => w.path);
  if (laterFiles.length > 0) {
    log(
      `5. update-heads: day by day on days ${DEMO_FIT_DAYS + 1}-${written.length}, trees frozen; NE and calibration of each new day`,
    );
    let state: HeadState = learned.state;
    for (const [i, file] of laterFiles.entries()) {
      const day = DEMO_FIT_DAYS + i + 1;
      learned = await learnHeadsFromFiles([file], schema, config, fitted.forests, { state });
      state = learned.state;
      headsPath = join(headsDir, `heads-day-${String(day).padStart(2, "0")}.state`);
      await saveHeadState(headsPath, state);
      const figures = headReportSummary(learned.report)
        .map((h) => {
          const f = h.lastSlice ?? h.overall;
          const ne = f.normalizedEntropy === null ? "n/a" : f.normalizedEntropy.toFixed(3);
          const cal = f.calibration === null ? "n/a" : f.calibration.toFixed(2);
          return `${h.outcome} ${ne}/${cal}`;
        })
        .join("  ");
      log(`   day ${String(day).padStart(2, "0")} NE/calibration: ${figures}`);
    }
  }
  log(`   heads saved under ${headsDir}`);

  const artifactPath = join(options.out, "scorer.json");
  const input = artifactInputOf(fitted.forests, learned.state, demoValueWeights, {
    name: `plotline demo, seed ${options.seed}`,
    dataWindows: [
      { stage: "trees", files: fitFiles, rows: fitted.rowsRead, from: null, to: null },
      {
        stage: "heads",
        files: written.map((w) => w.path),
        rows: learned.state.rowCount,
        from: timeOrNull(learned.state.firstTimestamp),
        to: timeOrNull(learned.state.lastTimestamp),
      },
    ],
  });
  const exported = await exportArtifact(artifactPath, input);
  log(
    `6. export: ${artifactPath}, ${(exported.bytes / 1024).toFixed(0)} KiB, ${exported.checksum.slice(0, 23)}...`,
  );
  const last = written[written.length - 1];
  const items = await scoreItemsFromFile(last.path, schema, 2000);
  const latency = latencyRow(buildArtifact(input), items, { repetitions: 5 });
  log(`   latency of one thread on ${items.length} items of ${last.path}:`);
  log(formatLatencyTable([latency]).replace(/^/gm, "   "));
  return { dataFiles: written.map((w) => w.path), rows, forestsPath, headsPath, artifactPath };
}

function timeOrNull(ms: number | null): string | null {
  return ms === null ? null : new Date(ms).toISOString();
}
