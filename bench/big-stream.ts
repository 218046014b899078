/**
 * Bounded-memory benchmark on one big log: generates (or reuses) a Plotline CSV
 * of 20,000,000 rows (several GB), then
 *   (a) fits trees on a reservoir sample of it, reading the whole file once
 *       without holding it (fitTreesFromFile, the op behind `leafcast fit-trees`), and
 *   (b) learns the heads over every row, streaming (learnHeadsFromFiles, the op
 *       behind `leafcast learn-heads`, checkpoints included).
 * Each phase runs in a fresh child process, so its peak RSS (maxRSS from
 * process.resourceUsage) is its own. Prints rows per second, CPU time per row and
 * peak RSS per phase; the target is a peak RSS under 1 GB in every phase. The
 * last line is one JSON object of the figures.
 *
 * Run: npm run bench:stream
 *   --rows N    rows of the log (default 20,000,000)
 *   --seed N    Plotline seed (default 1)
 *   --dir PATH  scratch folder (default leafcast-big-stream under the OS temp folder);
 *               a log of the same rows and seed found there is reused
 *   --keep      keep the log and outputs (otherwise removed at the end)
 */
import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, rmSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { writePlotline } from "../datasets/plotline/write-plotline.js";
import { saveHeadState } from "../trainer/heads/save-head-state.js";
import { removeFileIfPresent } from "../trainer/io/remove-file-if-present.js";
import { writeFileAtomic } from "../trainer/io/write-file-atomic.js";
import { plotlineSchemaPath } from "../trainer/package-root.js";
import { learnHeadsFromFiles } from "../trainer/pipeline/learn-heads-from-files.js";
import { loadDatasetSchema } from "../trainer/schema/load-dataset-schema.js";
import { resolveTrainingConfig } from "../trainer/schema/load-training-config.js";
import { fitTreesFromFile } from "../trainer/trees/fit-trees-from-file.js";
import { readForestFile } from "../trainer/trees/read-forest-file.js";
import { writeForestFile } from "../trainer/trees/write-forest-file.js";

function option(name: string, fallback: number): number {
  const at = process.argv.indexOf(`--${name}`);
  return at >= 0 ? Number(process.argv[at + 1]) : fallback;
}

function textOption(name: string): string | undefined {
  const at = process.argv.indexOf(`--${name}`);
  return at >= 0 ? process.argv[at + 1] : undefined;
}

const rows = option("rows", 20_000_000);
const seed = option("seed", 1);
const dir = textOption("dir") ?? join(tmpdir(), "leafcast-big-stream");
const keep = process.argv.includes("--keep");
const dataPath = join(dir, `plotline-${rows}-seed-${seed}.csv`);
const metaPath = `${dataPath}.meta.json`;
const forestsPath = join(dir, "forests.json");
const headsPath = join(dir, "heads.state");

/**
 * The run's configuration: a sample of 500,000 rows for the trees (the default
 * two million would make the fit, not the read, the whole phase) and a head
 * checkpoint every 5,000,000 rows (a few saves at 20 M rows: the resume points
 * of a long run, without the default 1,000,000 making saves a large share of
 * the work). The fit phase's rows per second count the rows read, fit included.
 */
const config = resolveTrainingConfig({
  seed,
  trees: { count: 40, depth: 6, sampleRows: 500_000, patience: 10 },
  checkpoint: { everyRows: 5_000_000 },
});

/** What one phase measured, printed by its child process as its last line. */
interface PhaseFigures {
  readonly phase: string;
  readonly rows: number;
  readonly seconds: number;
  readonly rowsPerSecond: number;
  readonly coreUsPerRow: number;
  readonly peakRssMb: number;
  readonly detail: string;
}

async function runPhase(phase: string): Promise<PhaseFigures> {
  const schema = await loadDatasetSchema(plotlineSchemaPath());
  const cpuBefore = process.cpuUsage();
  const started = performance.now();
  let done = 0;
  let detail = "";
  if (phase === "generate") {
    const written = await writePlotline(dataPath, "csv", { seed, rows });
    done = written.rows;
    await writeFileAtomic(metaPath, JSON.stringify({ rows, seed, bytes: written.bytes }));
    detail = `${(written.bytes / 1e9).toFixed(2)} GB`;
  } else if (phase === "fit") {
    const fitted = await fitTreesFromFile(dataPath, schema, config);
    await writeForestFile(forestsPath, fitted.forests);
    done = fitted.rowsRead;
    const trees = fitted.forests.forests.map((f) => f.forest.trees.length);
    detail = `${fitted.rowsSampled} rows sampled, ${trees.length} forests, ${trees.reduce((a, b) => a + b, 0)} trees`;
  } else if (phase === "heads") {
    const forests = await readForestFile(forestsPath);
    let checkpoints = 0;
    // A fresh run every time: a checkpoint left by an earlier run must not shorten this one.
    const learned = await learnHeadsFromFiles([dataPath], schema, config, forests, {
      checkpointPath: `${headsPath}.checkpoint`,
      restart: true,
      onCheckpoint: () => {
        checkpoints++;
      },
    });
    await saveHeadState(headsPath, learned.state);
    await removeFileIfPresent(`${headsPath}.checkpoint`);
    done = learned.state.rowCount;
    detail = `${learned.report.length} heads, ${config.workers} workers, ${checkpoints} checkpoints`;
  } else {
    throw new Error(`big-stream: unknown phase "${phase}"`);
  }
  const seconds = (performance.now() - started) / 1000;
  // CPU time of all threads: on a shared machine core-us per row says what wall time cannot.
  const cpu = process.cpuUsage(cpuBefore);
  return {
    phase,
    rows: done,
    seconds,
    rowsPerSecond: done / seconds,
    coreUsPerRow: (cpu.user + cpu.system) / Math.max(1, done),
    peakRssMb: process.resourceUsage().maxRSS / 1024,
    detail,
  };
}

/** Runs a phase in a fresh process and reads its figures from the last line of its output. */
function child(phase: string): PhaseFigures {
  const script = fileURLToPath(import.meta.url);
  const result = spawnSync(
    process.execPath,
    [...process.execArgv, script, ...process.argv.slice(2), "--phase", phase],
    { encoding: "utf8", maxBuffer: 16 << 20, stdio: ["ignore", "pipe", "inherit"] },
  );
  const last = result.stdout.trim().split("\n").pop() ?? "";
  if (result.status !== 0 || !last.startsWith("{")) {
    throw new Error(`big-stream: phase "${phase}" failed (exit ${result.status}): ${last}`);
  }
  return JSON.parse(last) as PhaseFigures;
}

/** True when the folder already holds a complete log of these rows and seed. */
function reusable(): boolean {
  if (!existsSync(dataPath) || !existsSync(metaPath)) return false;
  try {
    const meta = JSON.parse(readFileSync(metaPath, "utf8")) as Record<string, unknown>;
    return meta.rows === rows && meta.seed === seed && meta.bytes === statSync(dataPath).size;
  } catch {
    return false;
  }
}

const phaseAt = process.argv.indexOf("--phase");
if (phaseAt >= 0) {
  console.log(JSON.stringify(await runPhase(process.argv[phaseAt + 1])));
} else {
  if (!Number.isSafeInteger(rows) || rows < 1) throw new Error(`big-stream: --rows ${rows}`);
  const madeDir = !existsSync(dir);
  mkdirSync(dir, { recursive: true });
  console.log(
    `big-stream benchmark: ${rows.toLocaleString("en-US")} Plotline rows (seed ${seed}) as CSV in ${dir}; ` +
      `each phase in a fresh process; core-us/row is CPU time of all threads per row`,
  );
  const line = (label: string, m: PhaseFigures): void => {
    const rate = Math.round(m.rowsPerSecond).toLocaleString("en-US").padStart(10);
    console.log(
      `  ${label.padEnd(34)} ${rate} rows/s  ${m.coreUsPerRow.toFixed(2).padStart(6)} core-us/row  ` +
        `peak RSS ${m.peakRssMb.toFixed(0).padStart(4)} MB  ${m.seconds.toFixed(1)} s  (${m.detail})`,
    );
  };
  let generate: PhaseFigures | null = null;
  if (reusable()) {
    console.log(`  reusing ${dataPath} (${(statSync(dataPath).size / 1e9).toFixed(2)} GB)`);
  } else {
    generate = child("generate");
    line("generate the CSV", generate);
  }
  const fit = child("fit");
  line("fit trees on a reservoir sample", fit);
  const heads = child("heads");
  line("learn heads over every row", heads);
  const peak = Math.max(fit.peakRssMb, heads.peakRssMb, generate?.peakRssMb ?? 0);
  console.log(
    `  target: peak RSS < 1024 MB in every phase: ${peak < 1024 ? "met" : "NOT met"} (${peak.toFixed(0)} MB)`,
  );
  const bytes = statSync(dataPath).size;
  if (!keep) {
    for (const path of [dataPath, metaPath, forestsPath, headsPath, `${headsPath}.checkpoint`])
      rmSync(path, { force: true });
    if (madeDir) rmSync(dir, { recursive: true, force: true });
  }
  const figures = (m: PhaseFigures | null): Record<string, number> | null =>
    m === null
      ? null
      : {
          rowsPerSecond: Math.round(m.rowsPerSecond),
          coreUsPerRow: Number(m.coreUsPerRow.toFixed(3)),
          peakRssMb: Math.round(m.peakRssMb),
          seconds: Number(m.seconds.toFixed(1)),
        };
  console.log(
    JSON.stringify({
      bench: "big-stream",
      rows,
      fileBytes: bytes,
      workers: config.workers,
      generate: figures(generate),
      fitTrees: figures(fit),
      learnHeads: figures(heads),
      peakRssMb: Math.round(peak),
      peakRssUnder1Gb: peak < 1024,
    }),
  );
}
