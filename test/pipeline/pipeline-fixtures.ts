import { mkdtemp } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { writePlotlineDays } from "../../datasets/plotline/write-plotline-days.js";
import type { PlotlineOptions } from "../../datasets/plotline/plotline-options.js";
import {
  loadDatasetSchema,
  type ResolvedSchema,
} from "../../trainer/schema/load-dataset-schema.js";

/** A temporary directory of Plotline day files (Parquet: the quickest to read back). */
export async function plotlineDays(
  prefix: string,
  options: PlotlineOptions,
): Promise<{ dir: string; paths: string[] }> {
  const dir = await mkdtemp(join(tmpdir(), prefix));
  const written = await writePlotlineDays(dir, "parquet", options);
  return { dir, paths: written.map((w) => w.path) };
}

/** The shipped Plotline dataset schema. */
export function plotlineSchema(): Promise<ResolvedSchema> {
  return loadDatasetSchema("datasets/plotline.schema.json");
}

/** True when two arrays hold the same bits (so -0 differs from 0, and NaN equals NaN). */
export function sameBits(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  const x = new Uint32Array(a.buffer, a.byteOffset, a.length * 2);
  const y = new Uint32Array(b.buffer, b.byteOffset, b.length * 2);
  for (let i = 0; i < x.length; i++) if (x[i] !== y[i]) return false;
  return true;
}
