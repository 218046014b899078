/**
 * Scorer benchmark: a generated Plotline artifact of 100 trees of depth 6, six
 * heads, hashed categoricals and a cross, loaded from its text as a service
 * would. Prints the artifact size, batch cost per item (split into trees and
 * heads) and the single-item latency distribution, then ml-cart's prediction of
 * one comparable depth-6 regression tree (an independent CART package, fitted
 * on a small sample of the same items) measured in this run, per item and per
 * tree. The last line is one JSON object of the figures.
 *
 * Targets on one thread: batch <= 1.5 us per item, single-item p50 <= 3 us.
 *
 * Run: npm run bench:score  (options: --items N --repetitions N --cart-rows N)
 */
import { columnsFromItems } from "../scorer/columns-from-items.js";
import { loadScorer } from "../scorer/load-scorer.js";
import { measureLatency } from "../scorer/measure-latency.js";
import { buildArtifact } from "../trainer/artifact/build-artifact.js";
import { formatArtifactText } from "../trainer/artifact/format-artifact-text.js";
import { syntheticItems } from "../trainer/artifact/synthetic-items.js";
import { SYNTHETIC_NUMERIC, syntheticModel } from "../trainer/artifact/synthetic-model.js";

interface MlCartRegression {
  train(x: number[][], y: number[]): void;
  predict(x: number[][]): number[];
}
interface MlCart {
  DecisionTreeRegression: new (options: { maxDepth: number }) => MlCartRegression;
}

function option(name: string, fallback: number): number {
  const at = process.argv.indexOf(`--${name}`);
  return at >= 0 ? Number(process.argv[at + 1]) : fallback;
}

const TREES = 100;
const DEPTH = 6;
const itemCount = option("items", 4096);
const repetitions = option("repetitions", 10);
const cartRows = option("cart-rows", 2000);

const artifact = buildArtifact(syntheticModel({ trees: TREES, depth: DEPTH }));
const text = formatArtifactText(artifact);
const artifactBytes = new TextEncoder().encode(text).length;
const loadStart = performance.now();
const scorer = loadScorer(text);
const loadMs = performance.now() - loadStart;
const items = syntheticItems(itemCount);

const report = measureLatency(scorer, items, { warmup: 5000, repetitions });

// Process CPU time per item (user + system, a mean): on a machine shared with other
// work, wall-clock figures swell with every process that gets the core, CPU time
// far less, so this is the figure to compare variants by.
const cpuNs = (): number => {
  const usage = process.cpuUsage();
  return (usage.user + usage.system) * 1000;
};
const columnar = columnsFromItems(scorer.features, items);
const outputs = scorer.allocateScores(items.length);
let cpuStart = cpuNs();
for (let r = 0; r < repetitions; r++) scorer.scoreBatch(columnar, outputs);
const batchCpuPerItem = (cpuNs() - cpuStart) / (repetitions * items.length);
let cpuSink = 0;
cpuStart = cpuNs();
for (let r = 0; r < repetitions; r++)
  for (const item of items) cpuSink += scorer.scoreOne(item).combined;
const singleCpuPerItem = (cpuNs() - cpuStart) / (repetitions * items.length);

// ml-cart: one regression tree of the same depth over the same numeric features.
const cart = (await import("ml-cart" as string)) as MlCart;
const rows = items.map((item) =>
  SYNTHETIC_NUMERIC.map((name) => (typeof item[name] === "number" ? (item[name] as number) : 0)),
);
const target = rows.map((row) => Math.sin(row[0]) + 0.3 * row[1] - 0.1 * row[2] * row[3]);
const tree = new cart.DecisionTreeRegression({ maxDepth: DEPTH });
tree.train(rows.slice(0, cartRows), target.slice(0, cartRows));
let sink = 0;
for (let i = 0; i < 5000; i++) sink += tree.predict([rows[i % rows.length]])[0];
const cartTimes: number[] = [];
for (let r = 0; r < repetitions; r++) {
  const t0 = performance.now();
  for (const row of rows) sink += tree.predict([row])[0];
  cartTimes.push(((performance.now() - t0) * 1e6) / rows.length);
}
const cartBatchTimes: number[] = [];
for (let r = 0; r < repetitions; r++) {
  const t0 = performance.now();
  sink += tree.predict(rows)[0];
  cartBatchTimes.push(((performance.now() - t0) * 1e6) / rows.length);
}
const median = (values: number[]): number => [...values].sort((a, b) => a - b)[values.length >> 1];
const cartPerItem = median(cartTimes);
const cartBatchPerItem = median(cartBatchTimes);

const us = (ns: number): string => `${(ns / 1000).toFixed(3)} us`;
const s = report.single;
console.log(
  `scorer benchmark: ${TREES} trees of depth ${DEPTH}, ${scorer.outcomes.length} heads, ${itemCount} items, ${repetitions} repetitions`,
);
console.log(
  `artifact: ${artifactBytes} bytes (${(artifactBytes / 1024).toFixed(1)} KiB), loaded in ${loadMs.toFixed(1)} ms`,
);
console.log(
  `batch:  ${us(report.batch.nsPerItem)} per item (trees ${us(report.batch.treesNsPerItem)}, heads ${us(report.batch.headsNsPerItem)}); ${(report.batch.treesNsPerItem / TREES).toFixed(1)} ns per tree per item`,
);
console.log(
  `single: p50 ${us(s.total.p50)}  p90 ${us(s.total.p90)}  p99 ${us(s.total.p99)}  p99.9 ${us(s.total.p999)}  max ${us(s.total.max)}  (${s.total.samples} calls)`,
);
console.log(
  `        trees only: p50 ${us(s.trees.p50)}  p99 ${us(s.trees.p99)}; heads p50 ~${us(s.headsP50)}`,
);
console.log(
  `cpu:    batch ${us(batchCpuPerItem)} per item, single ${us(singleCpuPerItem)} per call (process CPU time, mean; checksum ${cpuSink.toFixed(3)})`,
);
console.log(
  `timer:  ${report.timer.overheadNs.toFixed(0)} ns per reading (subtracted), finest step ${report.timer.resolutionNs.toFixed(0)} ns`,
);
console.log(
  `ml-cart, one depth-${DEPTH} tree: ${cartPerItem.toFixed(0)} ns per item called one by one, ${cartBatchPerItem.toFixed(0)} ns per item in one predict call (checksum ${sink.toFixed(3)})`,
);
console.log(
  `targets: batch <= 1.5 us per item: ${report.batch.nsPerItem <= 1500 ? "met" : "missed"}; single p50 <= 3 us: ${s.total.p50 <= 3000 ? "met" : "missed"}`,
);
console.log(
  JSON.stringify({
    batch_ns_per_item: Math.round(report.batch.nsPerItem),
    single_p50_ns: Math.round(s.total.p50),
    single_p99_ns: Math.round(s.total.p99),
    artifact_bytes: artifactBytes,
    ml_cart_ns_per_tree_item: Math.round(cartPerItem),
    batch_trees_ns_per_item: Math.round(report.batch.treesNsPerItem),
    batch_heads_ns_per_item: Math.round(report.batch.headsNsPerItem),
    single_p90_ns: Math.round(s.total.p90),
    single_p999_ns: Math.round(s.total.p999),
    single_max_ns: Math.round(s.total.max),
    ml_cart_batch_ns_per_tree_item: Math.round(cartBatchPerItem),
    load_ms: Math.round(loadMs),
    batch_cpu_ns_per_item: Math.round(batchCpuPerItem),
    single_cpu_ns_per_item: Math.round(singleCpuPerItem),
  }),
);
