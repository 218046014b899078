// Determinism of the whole pipeline: the same Plotline data, configuration and
// seed through fit trees -> learn heads -> export give byte-identical files,
// run after run and whatever the number of worker threads for the trees (the
// configuration's `workers`) and for the heads (learnHeadsFromFiles' `workers`).
// The one field allowed to differ is the artifact's provenance.createdAt (when
// it was exported); the checksum covers it, so both are blanked before the
// byte comparison, and the checksums are then compared with createdAt set equal.
import { mkdtemp, readFile, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { writePlotline } from "../../datasets/plotline/write-plotline.js";
import { artifactChecksum } from "../../scorer/artifact-checksum.js";
import { loadScorer } from "../../scorer/load-scorer.js";
import { exportArtifact } from "../../trainer/artifact/export-artifact.js";
import { plotlineSchemaPath } from "../../trainer/package-root.js";
import { artifactInputOf } from "../../trainer/pipeline/artifact-input-of.js";
import { learnHeadsFromFiles } from "../../trainer/pipeline/learn-heads-from-files.js";
import {
  loadDatasetSchema,
  type ResolvedSchema,
} from "../../trainer/schema/load-dataset-schema.js";
import {
  resolveTrainingConfig,
  type ResolvedTrainingConfig,
} from "../../trainer/schema/load-training-config.js";
import {
  fitTreesFromFile,
  type FitTreesFromFileResult,
} from "../../trainer/trees/fit-trees-from-file.js";
import { writeForestFile } from "../../trainer/trees/write-forest-file.js";

let dir = "";
let dataPath = "";
let schema: ResolvedSchema;

/**
 * A configuration that draws on the seed everywhere it can: row and feature
 * subsampling per tree, a validation split, negative subsampling of a head,
 * hashed columns and a cross, standardized numerics.
 */
function configWith(workers: number): ResolvedTrainingConfig {
  return resolveTrainingConfig({
    seed: 11,
    workers,
    batchRows: 1500,
    trees: {
      count: 6,
      depth: 4,
      bins: 31,
      rowFraction: 0.8,
      featureFraction: 0.8,
      validationFraction: 0.2,
      patience: 0,
      sampleRows: 5000,
    },
    heads: {
      hashBits: 12,
      crosses: [["post_type", "garden_site"]],
      negativeKeepRate: { open: 0.5 },
    },
  });
}

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), "leafcast-determinism-"));
  dataPath = join(dir, "plotline.csv");
  // 6,000 rows over 3 days: more than the 5,000-row tree sample, so the reservoir draws.
  await writePlotline(dataPath, "csv", { seed: 5, days: 3, rowsPerDay: 2000 });
  schema = await loadDatasetSchema(plotlineSchemaPath());
});
afterAll(() => rm(dir, { recursive: true, force: true }));

const fits = new Map<string, FitTreesFromFileResult>();

/** Fits trees with `workers` threads (label distinguishes repeated runs) and writes the forest file. */
async function fit(label: string, workers: number): Promise<Buffer> {
  const fitted = await fitTreesFromFile(dataPath, schema, configWith(workers));
  fits.set(label, fitted);
  const path = join(dir, `forests-${label}.json`);
  await writeForestFile(path, fitted.forests);
  return readFile(path);
}

/** Learns heads over the trees of fit `label` with `workers` threads, exports, and returns the artifact's text. */
async function pipeline(label: string, workers: number, name: string): Promise<string> {
  const fitted = fits.get(label);
  if (fitted === undefined) throw new Error(`no fit ${label}`);
  const learned = await learnHeadsFromFiles([dataPath], schema, configWith(1), fitted.forests, {
    workers,
  });
  const path = join(dir, `artifact-${name}.json`);
  await exportArtifact(
    path,
    artifactInputOf(
      fitted.forests,
      learned.state,
      { hide: -10 },
      {
        name: "plotline determinism",
        dataWindows: [
          { stage: "trees", files: ["plotline.csv"], rows: fitted.rowsRead, from: null, to: null },
          {
            stage: "heads",
            files: ["plotline.csv"],
            rows: learned.state.rowCount,
            from: null,
            to: null,
          },
        ],
      },
    ),
  );
  return readFile(path, "utf8");
}

/** The artifact text with the creation time and the checksum (which covers it) blanked. */
function blanked(text: string): string {
  const out = text
    .replace(/"createdAt": "[^"]*"/, '"createdAt": ""')
    .replace(/"checksum": "sha256:[0-9a-f]{64}"/, '"checksum": ""');
  expect(out.match(/"createdAt": ""/g)).toHaveLength(1);
  expect(out.match(/"checksum": ""/g)).toHaveLength(1);
  return out;
}

/** The checksum the artifact would carry had it been exported at a fixed time. */
function checksumAtFixedTime(text: string): string {
  const doc = JSON.parse(text) as { provenance: { createdAt: string } };
  doc.provenance.createdAt = "2025-06-02T06:00:00.000Z";
  return artifactChecksum(doc);
}

describe("byte-identical artifacts for the same data, configuration and seed", () => {
  it("across runs and across 1 or 2 workers for the trees and for the heads", async () => {
    // Trees: twice with 1 worker, once with 2.
    const forests1 = await fit("trees-1", 1);
    const forests1Again = await fit("trees-1-again", 1);
    const forests2 = await fit("trees-2", 2);
    expect(forests1Again.equals(forests1)).toBe(true);
    expect(forests2.equals(forests1)).toBe(true);
    expect(fits.get("trees-1")?.rowsSampled).toBe(5000);

    // Heads: 1 and 2 workers (and 0, on this thread) over each fit.
    const artifacts = new Map<string, string>([
      ["trees 1 / heads 1", await pipeline("trees-1", 1, "a")],
      ["trees 1 again / heads 1", await pipeline("trees-1-again", 1, "b")],
      ["trees 2 / heads 2", await pipeline("trees-2", 2, "c")],
      ["trees 1 / heads 2", await pipeline("trees-1", 2, "d")],
      ["trees 2 / heads 0 (main thread)", await pipeline("trees-2", 0, "e")],
    ]);
    const [first, ...others] = [...artifacts.entries()];
    const reference = blanked(first[1]);
    const checksum = checksumAtFixedTime(first[1]);
    // The artifact holds real trees and heads, and loads.
    expect(JSON.parse(first[1]).forests.length).toBeGreaterThan(0);
    expect(loadScorer(first[1]).outcomes.length).toBeGreaterThan(0);
    for (const [name, text] of others) {
      expect(blanked(text), name).toBe(reference);
      expect(checksumAtFixedTime(text), name).toBe(checksum);
      expect(Buffer.byteLength(text), name).toBe(Buffer.byteLength(first[1]));
    }
  });
});
