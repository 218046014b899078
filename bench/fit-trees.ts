/**
 * Tree-fitting benchmark: 100 trees of depth 6 with 255 bins on 2,500,000
 * generated rows x 8 numeric features, no row or feature subsampling, all cores.
 * Prints seconds, row x feature x tree updates per second, peak RSS, and the
 * per-row-per-tree cost against ml-cart (an independent CART package) fitting
 * one depth-6 regression tree on 5,000 of the same rows, measured in this run.
 * The last line is one JSON object of the figures.
 *
 * Run: npm run bench:fit  (options: --rows N --trees N --workers N --cart-rows N --block-rows N,
 * and --javascript to fit with the JavaScript kernels instead of the WebAssembly ones)
 */
import { availableParallelism, loadavg } from "node:os";
import { binFeatures } from "../trainer/trees/bin-features.js";
import { fitForests, type ForestSettings } from "../trainer/trees/fit-forests.js";
import { SeededRandom } from "../trainer/trees/seeded-random.js";
import { treeKernelModule } from "../trainer/trees/simd/tree-kernel.js";

interface MlCartRegression {
  train(x: number[][], y: number[]): void;
}
interface MlCart {
  DecisionTreeRegression: new (options: { maxDepth: number }) => MlCartRegression;
}

const FEATURES = 8;

function option(name: string, fallback: number): number {
  const at = process.argv.indexOf(`--${name}`);
  return at >= 0 ? Number(process.argv[at + 1]) : fallback;
}

/** Seeded features in [-1, 1) and a label from a nonlinear logit with interactions. */
function generate(rows: number, seed: number): { columns: Float64Array[]; label: Uint8Array } {
  const random = new SeededRandom(seed);
  const columns = Array.from({ length: FEATURES }, () => new Float64Array(rows));
  const label = new Uint8Array(rows);
  for (let r = 0; r < rows; r++) {
    for (let f = 0; f < FEATURES; f++) columns[f][r] = 2 * random.nextFloat() - 1;
    const x = (f: number): number => columns[f][r];
    const logit =
      -1.2 +
      1.5 * Math.sin(3 * x(0)) +
      1.2 * x(1) * x(2) -
      Math.abs(x(3)) +
      (x(4) > 0.3 ? 0.8 : 0) +
      0.6 * x(5) * x(5) -
      0.4 * x(6);
    label[r] = random.nextFloat() < 1 / (1 + Math.exp(-logit)) ? 1 : 0;
  }
  return { columns, label };
}

async function timeMlCart(
  columns: readonly Float64Array[],
  label: Uint8Array,
  rows: number,
): Promise<number> {
  const specifier: string = "ml-cart"; // no type declarations ship with ml-cart
  const mlCart = (await import(specifier)) as MlCart;
  const x = Array.from({ length: rows }, (_, r) => columns.map((column) => column[r]));
  let positives = 0;
  for (let r = 0; r < rows; r++) positives += label[r];
  const p = positives / rows;
  // The first boosting tree's targets: gradients p - y at the base rate.
  const y = Array.from({ length: rows }, (_, r) => p - label[r]);
  const started = performance.now();
  new mlCart.DecisionTreeRegression({ maxDepth: 6 }).train(x, y);
  return (performance.now() - started) / 1000;
}

async function main(): Promise<void> {
  const rows = option("rows", 2_500_000);
  const trees = option("trees", 100);
  const workers = option("workers", availableParallelism());
  const cartRows = option("cart-rows", 5_000);
  const blockRows = option("block-rows", 0);
  const javascriptKernels = process.argv.includes("--javascript");
  const kernels = javascriptKernels || treeKernelModule() === null ? "JavaScript" : "WebAssembly";
  console.log(
    `fit-trees: ${rows} rows x ${FEATURES} features, ${trees} trees of depth 6, 255 bins, ${workers} workers, ${kernels} kernels`,
  );

  let data: { columns: Float64Array[]; label: Uint8Array } | null = generate(rows, 42);
  const label = data.label;
  const cartColumns = data.columns.map((column) => column.slice(0, cartRows));
  const binStarted = performance.now();
  const binned = binFeatures(
    {
      rowCount: rows,
      numeric: data.columns.map((values, f) => ({ name: `x${f}`, values })),
      categorical: [],
    },
    { bins: 255, binSampleRows: 200_000, maxCategories: 32, seed: 1 },
  );
  const binSeconds = (performance.now() - binStarted) / 1000;
  data = null; // let the raw columns go: the trees need only the bins
  console.log(`binning: ${binSeconds.toFixed(2)} s`);

  const settings: ForestSettings = {
    count: trees,
    depth: 6,
    leaves: 64,
    learningRate: 0.1,
    l2: 1,
    minLeafHessian: 1e-3,
    minSplitGain: 0,
    rowFraction: 1,
    featureFraction: 1,
    validationFraction: 0,
    patience: 0,
  };
  const started = performance.now();
  const cpuStarted = process.cpuUsage();
  const [fitted] = await fitForests(binned, [{ outcome: "y", label }], {
    settings,
    seed: 1,
    workers,
    ...(blockRows > 0 ? { blockRows } : {}),
    javascriptKernels,
    onProgress: (p) => {
      if (p.tree % 10 === 0) {
        console.log(
          `  tree ${p.tree}/${p.trees}  train loss ${p.trainLoss.toFixed(5)}  ${p.elapsedSeconds.toFixed(1)} s`,
        );
      }
    },
  });
  const seconds = (performance.now() - started) / 1000;
  const cpu = process.cpuUsage(cpuStarted);
  const cpuSeconds = (cpu.user + cpu.system) / 1e6;
  const load = loadavg()[0];
  const peakRssMb = process.resourceUsage().maxRSS / 1024;
  const updates = (rows * FEATURES * fitted.treesFitted) / seconds;
  console.log(
    `fit: ${seconds.toFixed(2)} s for ${fitted.treesFitted} trees (train loss ${fitted.startTrainLoss.toFixed(5)} -> ${fitted.trainLoss[fitted.treesFitted - 1].toFixed(5)})`,
  );
  console.log(`updates: ${(updates / 1e6).toFixed(1)} million row x feature x tree per second`);
  // Other processes share the cores: CPU time (all threads) and the load average say how much.
  console.log(
    `cpu: ${cpuSeconds.toFixed(1)} s over all threads; 1-minute load average ${load.toFixed(1)} on ${availableParallelism()} cores`,
  );
  console.log(
    `peak RSS: ${peakRssMb.toFixed(0)} MB (raw columns: ${((rows * FEATURES * 8) / 1048576).toFixed(0)} MB)`,
  );

  const cartSeconds = await timeMlCart(cartColumns, label.subarray(0, cartRows), cartRows);
  const ours = seconds / (rows * fitted.treesFitted);
  const theirs = cartSeconds / cartRows;
  const speedup = theirs / ours;
  console.log(
    `ml-cart: ${cartSeconds.toFixed(2)} s for one depth-6 tree on ${cartRows} rows; per row and tree ours is ${speedup.toFixed(0)} x faster`,
  );
  console.log(
    JSON.stringify({
      rows,
      features: FEATURES,
      trees: fitted.treesFitted,
      seconds: Number(seconds.toFixed(3)),
      updates_per_s: Math.round(updates),
      peak_rss_mb: Math.round(peakRssMb),
      speedup_vs_ml_cart: Math.round(speedup),
      bin_seconds: Number(binSeconds.toFixed(3)),
      ml_cart_seconds: Number(cartSeconds.toFixed(3)),
      cpu_seconds: Number(cpuSeconds.toFixed(3)),
      load_average: Number(load.toFixed(2)),
      workers,
      kernels,
    }),
  );
}

await main();
