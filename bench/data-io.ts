/**
 * Data benchmark: generates the Plotline log and writes it in each format
 * (CSV, NDJSON, Parquet, Arrow IPC), then reads each file back through
 * openDataFile with datasets/plotline.schema.json. Prints generation speed
 * alone, write speed (generation included) and read speed in rows per second,
 * file sizes and peak memory. Each step runs in a child process of its own, so
 * its peak resident size (process.resourceUsage().maxRSS) is its own. Files go
 * to a temporary folder that is removed at the end. The last line is one JSON
 * object of the figures.
 *
 * Target: writing CSV at 500,000 rows per second or more on one core.
 *
 * Run: npm run bench:data  (options: --rows N, default 5,000,000; --formats csv,arrow)
 */
import { spawnSync } from "node:child_process";
import { mkdtemp, rm, stat } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { generatePlotline } from "../datasets/plotline/generate-plotline.js";
import { writePlotline } from "../datasets/plotline/write-plotline.js";
import { openDataFile } from "../trainer/data/open-data-file.js";
import { DATA_FORMATS, type DataFormat } from "../trainer/data/write-columns.js";
import { loadDatasetSchema } from "../trainer/schema/load-dataset-schema.js";

interface StepResult {
  readonly rows: number;
  readonly seconds: number;
  readonly maxRssMb: number;
}

function option(name: string): string | undefined {
  const at = process.argv.indexOf(`--${name}`);
  return at >= 0 ? process.argv[at + 1] : undefined;
}

const rows = Number(option("rows") ?? 5_000_000);
const step = option("step");

if (step !== undefined) {
  // A child: run one step and print its figures as JSON.
  const result = await runStep(step, option("format") as DataFormat, option("path") ?? "", rows);
  process.stdout.write(JSON.stringify(result) + "\n");
} else {
  await runAll();
}

async function runStep(
  name: string,
  format: DataFormat,
  path: string,
  n: number,
): Promise<StepResult> {
  const start = performance.now();
  let count = 0;
  if (name === "generate") {
    // Touch one value per chunk so nothing is optimized away.
    let sink = 0;
    for (const chunk of generatePlotline({ rows: n }, true)) {
      count += chunk.rowCount;
      sink += chunk.columns.true_open[0];
    }
    if (Number.isNaN(sink)) throw new Error("bench: unexpected NaN");
  } else if (name === "write") {
    count = (await writePlotline(path, format, { rows: n })).rows;
  } else {
    const schemaPath = fileURLToPath(
      new URL("../../datasets/plotline.schema.json", import.meta.url),
    );
    const schema = await loadDatasetSchema(schemaPath);
    for await (const batch of openDataFile(path, schema, { format }).batches())
      count += batch.rowCount;
  }
  const seconds = (performance.now() - start) / 1000;
  return { rows: count, seconds, maxRssMb: process.resourceUsage().maxRSS / 1024 };
}

function child(name: string, format: DataFormat | "", path: string): StepResult {
  const script = fileURLToPath(import.meta.url);
  const args = [script, "--step", name, "--rows", String(rows), "--format", format, "--path", path];
  const run = spawnSync(process.execPath, args, {
    encoding: "utf8",
    stdio: ["ignore", "pipe", "inherit"],
  });
  if (run.status !== 0)
    throw new Error(`bench: step ${name} ${format} failed (exit ${run.status})`);
  const lines = run.stdout.trim().split("\n");
  return JSON.parse(lines[lines.length - 1]) as StepResult;
}

async function runAll(): Promise<void> {
  const formats = (option("formats")?.split(",") ?? DATA_FORMATS) as DataFormat[];
  const dir = await mkdtemp(join(tmpdir(), "leafcast-bench-data-"));
  const figures: Record<string, number> = { rows };
  const rate = (r: StepResult) => Math.round(r.rows / r.seconds);
  try {
    console.log(
      `Plotline data I/O, ${rows.toLocaleString("en")} rows (one child process per step)`,
    );
    const generated = child("generate", "", "");
    figures.generate_rows_per_s = rate(generated);
    figures.generate_max_rss_mb = Math.round(generated.maxRssMb);
    console.log(
      `generate only     ${fmt(rate(generated))} rows/s   peak RSS ${fmtMb(generated.maxRssMb)}`,
    );
    for (const format of formats) {
      const path = join(dir, `plotline.${format}`);
      const written = child("write", format, path);
      const bytes = (await stat(path)).size;
      const read = child("read", format, path);
      if (read.rows !== rows)
        throw new Error(`bench: read ${read.rows} rows of ${format}, expected ${rows}`);
      figures[`${format}_write_rows_per_s`] = rate(written);
      figures[`${format}_write_max_rss_mb`] = Math.round(written.maxRssMb);
      figures[`${format}_read_rows_per_s`] = rate(read);
      figures[`${format}_read_max_rss_mb`] = Math.round(read.maxRssMb);
      figures[`${format}_bytes`] = bytes;
      console.log(
        `${format.padEnd(8)} write ${fmt(rate(written))} rows/s (peak RSS ${fmtMb(written.maxRssMb)})` +
          `   read ${fmt(rate(read))} rows/s (peak RSS ${fmtMb(read.maxRssMb)})` +
          `   size ${(bytes / 2 ** 20).toFixed(1)} MiB (${(bytes / rows).toFixed(0)} B/row)`,
      );
    }
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
  console.log(JSON.stringify(figures));
}

function fmt(n: number): string {
  return n.toLocaleString("en").padStart(10);
}

function fmtMb(mb: number): string {
  return `${mb.toFixed(0)} MiB`;
}
