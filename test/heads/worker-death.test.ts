import { existsSync } from "node:fs";
import { readFile, rm, writeFile } from "node:fs/promises";
import { join } from "node:path";
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { plotlineDays } from "../pipeline/pipeline-fixtures.js";
import { runCliCaptured as run } from "../cli/run-cli-captured.js";

// What is checked (issue 7, "Workers"): a head-training worker that throws,
// crashes or exits surfaces as a clear LeafcastError (exit code 2 and a
// "heads: a head-training worker failed" line) with no hang and no output file,
// and the run then resumes from its last checkpoint to exactly the heads of an
// uninterrupted run. Faults are injected through LEAFCAST_TEST_HEAD_WORKER_FAULT,
// read only by the worker entry used when running from the TypeScript sources
// (trainer/heads/head-worker-from-source.mjs), never by a built tool.
const FAULT = "LEAFCAST_TEST_HEAD_WORKER_FAULT";
let dir = "";
let paths: string[] = [];
const schema = "datasets/plotline.schema.json";
let straight: Buffer;

function learnArgs(out: string): string[] {
  const config = join(dir, "config.json");
  return [
    "learn-heads",
    ...paths,
    "-s",
    schema,
    "-t",
    join(dir, "forests.json"),
    "-c",
    config,
    "-o",
    out,
  ];
}

beforeAll(async () => {
  ({ dir, paths } = await plotlineDays("leafcast-worker-death-", {
    seed: 31,
    days: 2,
    rowsPerDay: 2000,
    authors: 200,
    viewers: 1500,
  }));
  await writeFile(
    join(dir, "config.json"),
    JSON.stringify({
      seed: 2,
      workers: 2,
      batchRows: 400,
      trees: { count: 3, depth: 3, bins: 32, outcomes: ["open"], validationFraction: 0 },
      heads: { alpha: 0.1, hashBits: 10, negativeKeepRate: { hide: 0.4 } },
      checkpoint: { everyRows: 800 },
    }),
  );
  const fit = await run([
    "fit-trees",
    paths[0],
    "-s",
    schema,
    "-c",
    join(dir, "config.json"),
    "-o",
    join(dir, "forests.json"),
    "-q",
  ]);
  expect(fit.code).toBe(0);
  const once = await run(learnArgs(join(dir, "straight.state")));
  expect(once.code).toBe(0);
  straight = await readFile(join(dir, "straight.state"));
}, 60_000);
afterEach(() => {
  delete process.env[FAULT];
});
afterAll(() => rm(dir, { recursive: true, force: true }));

describe("head-training worker death", () => {
  it.each([
    ["throw", "throws while training", 5],
    ["crash", "crashes with an uncaught exception", 5],
    ["exit", "exits mid-batch", 4],
    ["exit-after", "exits while idle, after a batch that ends at a checkpoint", 2],
  ])(
    "%s: a worker that %s fails the run clearly; the run resumes exactly",
    async (kind, _what, at) => {
      const out = join(dir, `${kind}.state`);
      process.env[FAULT] = `${kind}:${at}`;
      const failed = await run(learnArgs(out));
      delete process.env[FAULT];
      expect(failed.code).toBe(2);
      expect(failed.err).toMatch(/^heads: a head-training worker failed: /m);
      // No partial output: --out is written only when the run is complete.
      expect(existsSync(out)).toBe(false);
      expect(existsSync(`${out}.checkpoint`)).toBe(true);

      const resumed = await run(learnArgs(out));
      expect(resumed.code).toBe(0);
      expect(resumed.err).toMatch(/resuming from .*\.checkpoint at \d+ rows/);
      expect((await readFile(out)).equals(straight)).toBe(true);
      expect(existsSync(`${out}.checkpoint`)).toBe(false);
    },
    60_000,
  );
});
