/**
 * Head-learning benchmark: six FTRL-Proximal heads over 100 trees of depth 6
 * plus 10 hashed categorical features (2^20 buckets), encoding included: each
 * batch goes through the scorer's RowEncoder (tree traversal + MurmurHash3),
 * then every head is scored (progressive validation) and trained on it. Timed on
 * one core (everything on the main thread) and with 1..N training threads (the
 * main thread encodes the next batch while workers train on this one; with
 * CALLER_TRAINS it also trains one block of heads), each with the WebAssembly
 * kernel and, as the reference, the JavaScript kernel; with peak RSS. Data and
 * trees are generated here (invented Plotline-like columns) before timing
 * starts. The last line is one JSON object of the figures.
 *
 * Target: >= 250,000 rows per second on the 2-core machine.
 *
 * Each measurement learns 4M rows (a day of a mid-size feed). A run pays a
 * fixed cost for starting workers, first touching ~200 MB of fresh state (slow
 * on this VM: 4-6.5 ms per MB) and draining the last batch: about 1.1 s here,
 * from 255k-262k rows/s on 2 workers over 1M rows against 321k-332k over 4M
 * (05:55 UTC on 2026-12-02), so over a quarter of a 1M-row run and under a
 * tenth of a 4M-row one. `--rows 1048576` measures the short run.
 *
 * Run: npm run bench:heads  (options: --rows N --batch N --workers N --hash-bits N --half-life N)
 */
import { spawnSync } from "node:child_process";
import { availableParallelism } from "node:os";
import { fileURLToPath } from "node:url";
import type { ColumnarBatch, ColumnInput } from "../scorer/columnar-batch.js";
import type {
  EncodingSpec,
  FeatureContract,
  ForestModel,
  TreeModel,
} from "../scorer/model-types.js";
import { RowEncoder } from "../scorer/row-encoder.js";
import type { HeadKernelChoice } from "../trainer/heads/block-trainer.js";
import type { HeadBatch, HeadSetup } from "../trainer/heads/head-setup.js";
import { CALLER_TRAINS, learnHeads } from "../trainer/heads/learn-heads.js";
import type { HeadSettings } from "../trainer/schema/load-training-config.js";

function option(name: string, fallback: number): number {
  const at = process.argv.indexOf(`--${name}`);
  return at >= 0 ? Number(process.argv[at + 1]) : fallback;
}

const TREES = 100;
const DEPTH = 6;
const NUMERIC = 16;
const HASHED = 10;
const OUTCOMES = ["open", "react", "reply", "save", "reshare", "hide"];
const rows = option("rows", 4_194_304);
const batchRows = option("batch", 65_536);
const maxWorkers = option("workers", availableParallelism());
const hashBits = option("hash-bits", 20);
/** With --half-life N, heads.averaging = { halfLifeRows: N, everyRows: N / 8 } (0: no averaging, the default). */
const halfLife = option("half-life", 0);

/** Seeded uniform numbers in [0, 1) (32-bit LCG, Numerical Recipes constants). */
function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296;
  };
}
const random = lcg(2024);

const contract: FeatureContract = {
  numeric: Array.from({ length: NUMERIC }, (_, f) => `plot_signal_${f}`),
  categorical: Array.from({ length: HASHED }, (_, c) => ({ name: `plot_tag_${c}`, values: [] })),
};
const encoding: EncodingSpec = {
  hashBits,
  hashSeed: 0,
  hashed: contract.categorical.map((c) => c.name),
  crosses: [],
  numeric: [],
};

/** Complete trees over uniform features, thresholds spread so that rows reach many leaves. */
function randomTree(): TreeModel {
  const nodes = 2 ** DEPTH - 1;
  const feature = Int32Array.from({ length: nodes }, () => Math.floor(random() * NUMERIC));
  const threshold = Float64Array.from({ length: nodes }, () => 0.2 + 0.6 * random());
  return {
    feature,
    threshold,
    missingRight: new Uint8Array(nodes),
    rightCategories: new Array<Int32Array | null>(nodes).fill(null),
    leafValue: Float64Array.from({ length: nodes + 1 }, () => random() - 0.5),
  };
}
const forests: ForestModel[] = [
  {
    outcome: "open",
    baseLogit: -1,
    depth: DEPTH,
    trees: Array.from({ length: TREES }, randomTree),
  },
];

// Tag columns range from a handful of values to tens of thousands (viewer-like ids).
const vocabulary = Array.from({ length: HASHED }, (_, c) => {
  const size = Math.round(10 * 3 ** c);
  return Array.from({ length: size }, (_, v) => `tag${c}-${v}`);
});

interface BenchBatch {
  readonly columns: ColumnarBatch;
  readonly labels: Uint8Array[];
  readonly timestamps: Float64Array;
}

function generateBatch(count: number, first: number): BenchBatch {
  const columns = new Map<string, ColumnInput>();
  const numeric = contract.numeric.map(() => new Float64Array(count));
  numeric.forEach((values, f) => {
    for (let r = 0; r < count; r++) values[r] = random();
    columns.set(contract.numeric[f], { kind: "number", values });
  });
  vocabulary.forEach((values, c) => {
    const codes = new Int32Array(count);
    for (let r = 0; r < count; r++) codes[r] = Math.floor(random() * random() * values.length);
    columns.set(encoding.hashed[c], {
      kind: "category",
      codes,
      dictionary: { list: () => values },
    });
  });
  const labels = OUTCOMES.map((_, h) => {
    const y = new Uint8Array(count);
    for (let r = 0; r < count; r++) {
      const logit = -1 - 0.8 * h + 2 * (numeric[h][r] - 0.5) + (numeric[h + 1][r] > 0.7 ? 1 : 0);
      y[r] = random() < 1 / (1 + Math.exp(-logit)) ? 1 : 0;
    }
    return y;
  });
  const timestamps = Float64Array.from({ length: count }, (_, r) => 1.7e12 + (first + r) * 50);
  return { columns: { rowCount: count, columns }, labels, timestamps };
}

const distinct = Math.min(8, Math.ceil(rows / batchRows));
const data = Array.from({ length: distinct }, (_, b) => generateBatch(batchRows, b * batchRows));
const encoder = new RowEncoder({ contract, forests, encoding });
const indexSize = encoder.layout.width;

/** The stream learnHeads reads: encoding happens here, inside the timed loop. */
async function* encodedStream(): AsyncGenerator<HeadBatch> {
  const buffers = encoder.allocate(batchRows);
  for (let done = 0, b = 0; done < rows; done += batchRows, b++) {
    const batch = data[b % distinct];
    const encoded = encoder.encode(batch.columns, buffers);
    yield { encoded, labels: batch.labels, weights: null, timestamps: batch.timestamps };
  }
}

const settings: HeadSettings = {
  outcomes: OUTCOMES,
  alpha: 0.05,
  beta: 1,
  lambda1: 0.5,
  lambda2: 1,
  hashBits,
  hashSeed: 0,
  hashed: encoding.hashed,
  crosses: [],
  numeric: [],
  negativeKeepRate: {},
  downsampleCorrection: "recalibrate",
  sliceHours: 24,
  averaging: halfLife > 0 ? { halfLifeRows: halfLife, everyRows: Math.ceil(halfLife / 8) } : null,
};
const setup: HeadSetup = {
  outcomes: OUTCOMES,
  settings,
  encoding,
  indexSize,
  seed: 1,
  treesFingerprint: "bench",
  schemaFingerprint: "bench",
};

async function rowsPerSecond(
  workers: number,
  kernel: HeadKernelChoice,
  callerTrains: boolean,
): Promise<number> {
  const started = performance.now();
  const state = await learnHeads(encodedStream(), setup, { workers, kernel, callerTrains });
  const seconds = (performance.now() - started) / 1000;
  if (state.rowCount < rows)
    throw new Error(`bench: expected ${rows} rows learned, found ${state.rowCount}`);
  return state.rowCount / seconds;
}

function encodeOnly(): number {
  const buffers = encoder.allocate(batchRows);
  const started = performance.now();
  for (let done = 0, b = 0; done < rows; done += batchRows, b++) {
    encoder.encode(data[b % distinct].columns, buffers);
  }
  return rows / ((performance.now() - started) / 1000);
}

/** One measurement in this process: "encode", or learning with N workers (0: on the main thread). */
async function measure(what: string): Promise<void> {
  // CPU time of all the process's threads: on a machine shared with other work,
  // core-microseconds per row show what wall-clock figures cannot.
  const cpuBefore = process.cpuUsage();
  const rate =
    what === "encode"
      ? encodeOnly()
      : // "2js": 2 workers with the JavaScript kernel instead of the WebAssembly one;
        // "2c": 2 training threads, the calling thread one of them; "2w": 2 workers beside it.
        await rowsPerSecond(
          Number.parseInt(what, 10),
          what.endsWith("js") ? "js" : "simd",
          what.endsWith("c") ? true : what.endsWith("w") ? false : CALLER_TRAINS,
        );
  const cpu = process.cpuUsage(cpuBefore);
  const coreUsPerRow = (cpu.user + cpu.system) / rows;
  const peakRssMb = process.resourceUsage().maxRSS / 1024;
  console.log(JSON.stringify({ what, rate, coreUsPerRow, peakRssMb }));
}

interface Measured {
  readonly rate: number;
  readonly coreUsPerRow: number;
  readonly peakRssMb: number;
}

/** Runs each measurement in a child process, so that peak RSS and JIT state are its own. */
function child(what: string): Measured {
  const script = fileURLToPath(import.meta.url);
  const result = spawnSync(
    process.execPath,
    [...process.execArgv, script, ...process.argv.slice(2), "--only", what],
    {
      encoding: "utf8",
      maxBuffer: 1 << 20,
    },
  );
  const last = result.stdout.trim().split("\n").pop() ?? "";
  if (result.status !== 0 || !last.startsWith("{")) {
    throw new Error(
      `bench: measurement "${what}" failed (exit ${result.status}): ${result.stderr}`,
    );
  }
  return JSON.parse(last) as Measured;
}

const only = process.argv.indexOf("--only");
if (only >= 0) {
  await measure(process.argv[only + 1]);
} else {
  console.log(
    `heads benchmark: ${OUTCOMES.length} heads, ${TREES} trees of depth ${DEPTH} + ${HASHED} hashed features ` +
      `(2^${hashBits} buckets), ${rows} rows in batches of ${batchRows}, index space ${indexSize}` +
      (halfLife > 0 ? `, weights averaged (half-life ${halfLife} rows)` : "") +
      "; " +
      `each line from a fresh process; core-us/row is CPU time of all threads per row`,
  );
  const line = (label: string, m: Measured): void => {
    const rate = Math.round(m.rate).toLocaleString("en-US").padStart(9);
    console.log(
      `  ${label.padEnd(40)} ${rate} rows/s  ${m.coreUsPerRow.toFixed(2).padStart(6)} core-us/row  peak RSS ${m.peakRssMb.toFixed(0)} MB`,
    );
  };
  const encode = child("encode");
  line("encoding only, one core", encode);
  const oneCore = child("0");
  line("encode + learn, one core (no workers)", oneCore);
  const byWorkers = new Map<number, Measured>();
  for (let workers = 1; workers <= maxWorkers; workers++) {
    byWorkers.set(workers, child(String(workers)));
    const label = workers > 1 && CALLER_TRAINS ? "training threads" : "worker thread(s)";
    line(`encode + learn, ${workers} ${label}`, byWorkers.get(workers) as Measured);
  }
  // The arrangement CALLER_TRAINS did not choose, for comparison.
  const other = child(`${maxWorkers}${CALLER_TRAINS ? "w" : "c"}`);
  line(
    CALLER_TRAINS
      ? `encode + learn, ${maxWorkers} workers beside the caller`
      : `encode + learn, caller + ${maxWorkers - 1} worker(s)`,
    other,
  );
  const scriptOne = child("0js");
  line("JavaScript kernel, one core", scriptOne);
  const scriptAll = child(`${maxWorkers}js`);
  line(`JavaScript kernel, ${maxWorkers} worker thread(s)`, scriptAll);
  const allCores = byWorkers.get(maxWorkers) ?? oneCore;
  const peakRss = Math.max(oneCore.peakRssMb, allCores.peakRssMb);
  console.log(`  target: >= 250,000 rows/s on all ${maxWorkers} cores`);
  const round = (m: Measured): number => Math.round(m.rate);
  console.log(
    JSON.stringify({
      rows_per_s_one_core: round(oneCore),
      rows_per_s_all_cores: round(allCores),
      peak_rss_mb: Math.round(peakRss),
      rows_per_s_encode_only: round(encode),
      rows_per_s_by_workers: Object.fromEntries([...byWorkers].map(([w, m]) => [w, round(m)])),
      rows_per_s_other_arrangement: round(other),
      rows_per_s_js_kernel: { one_core: round(scriptOne), all_cores: round(scriptAll) },
      core_us_per_row: {
        encode: encode.coreUsPerRow,
        one_core: oneCore.coreUsPerRow,
        all_cores: allCores.coreUsPerRow,
      },
    }),
  );
}
