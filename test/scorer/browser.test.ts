import { existsSync } from "node:fs";
import { createServer, type Server } from "node:http";
import type { AddressInfo } from "node:net";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { build } from "esbuild";
import { chromium, type Browser } from "playwright-core";
import { afterAll, describe, expect, it } from "vitest";
import { columnsFromItems } from "../../scorer/columns-from-items.js";
import { loadScorer } from "../../scorer/load-scorer.js";
import { buildArtifact } from "../../trainer/artifact/build-artifact.js";
import { formatArtifactText } from "../../trainer/artifact/format-artifact-text.js";
import { mixedItems, mixedModel } from "./fixtures.js";

const CHROMIUM = "/usr/bin/chromium";
const root = join(dirname(fileURLToPath(import.meta.url)), "../..");

/** Items travel as JSON; NaN, infinities and undefined travel tagged and are revived in the page. */
function encodeItems(items: readonly Record<string, unknown>[]): string {
  return JSON.stringify(items, (_, value: unknown) => {
    if (typeof value === "number" && !Number.isFinite(value)) return { $special: String(value) };
    return value === undefined ? { $special: "undefined" } : value;
  });
}

/** The page: import the bundle, fetch the artifact and items, score, publish the numbers. Plain JS, no build step. */
const PAGE = `<!doctype html><meta charset="utf-8"><title>leafcast scorer</title>
<script type="module">
const special = { NaN: NaN, Infinity: Infinity, "-Infinity": -Infinity, undefined: undefined };
try {
  const scorerModule = await import("/scorer.js");
  const text = await (await fetch("/model.json")).text();
  const items = JSON.parse(await (await fetch("/items.json")).text(), (key, value) =>
    value !== null && typeof value === "object" && "$special" in value ? special[value.$special] : value);
  const scorer = scorerModule.loadScorer(text);
  const one = items.map((item) => {
    const result = scorer.scoreOne(item);
    return [...scorer.outcomes.map((outcome) => result.probability[outcome]), result.combined];
  });
  const batch = scorer.scoreBatch(scorerModule.columnsFromItems(scorer.features, items));
  window.leafcastResult = {
    outcomes: scorer.outcomes,
    one,
    batch: [...scorer.outcomes.map((outcome) => Array.from(batch.probability[outcome])), Array.from(batch.combined)],
    rank: Array.from(scorer.rank(items)),
  };
} catch (error) {
  window.leafcastResult = { error: String(error && error.stack || error) };
}
</script>`;

let server: Server | undefined;
let browser: Browser | undefined;
afterAll(async () => {
  await browser?.close();
  await new Promise<void>((resolve) => (server ? server.close(() => resolve()) : resolve()));
});

describe("the scorer in a browser", () => {
  it("scores the same items to the same numbers in headless Chromium as in Node", async () => {
    if (!existsSync(CHROMIUM)) {
      throw new Error(
        `browser test: expected Chromium at ${CHROMIUM}, found nothing; install Debian's "chromium" package (apt-get install -y chromium; .ci/run does this)`,
      );
    }
    const bundle = await build({
      entryPoints: [join(root, "scorer/index.ts")],
      bundle: true,
      format: "esm",
      platform: "browser",
      write: false,
      logLevel: "silent",
    });
    const model = mixedModel();
    const artifactText = formatArtifactText(
      buildArtifact({ ...model, valueWeights: { open: 1, react: 2.5, hide: -7 } }),
    );
    const items = mixedItems(200);
    const files = new Map<string, [string, string]>([
      ["/", ["text/html", PAGE]],
      ["/scorer.js", ["text/javascript", bundle.outputFiles[0].text]],
      ["/model.json", ["application/json", artifactText]],
      ["/items.json", ["application/json", encodeItems(items)]],
    ]);
    server = createServer((request, response) => {
      const file = files.get(request.url ?? "");
      response.writeHead(file ? 200 : 404, { "content-type": file ? file[0] : "text/plain" });
      response.end(file ? file[1] : "not found");
    });
    await new Promise<void>((resolve) => server!.listen(0, "127.0.0.1", resolve));
    const { port } = server.address() as AddressInfo;

    browser = await chromium.launch({
      executablePath: CHROMIUM,
      args: [
        "--headless",
        "--no-sandbox",
        "--disable-gpu",
        "--disable-quic",
        "--no-first-run",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
      ],
    });
    const page = await browser.newPage();
    await page.goto(`http://127.0.0.1:${port}/`);
    await page.waitForFunction("window.leafcastResult !== undefined", undefined, {
      timeout: 60_000,
    });
    const inBrowser = (await page.evaluate("window.leafcastResult")) as {
      error?: string;
      outcomes: string[];
      one: number[][];
      batch: number[][];
      rank: number[];
    };
    expect(inBrowser.error).toBeUndefined();

    const scorer = loadScorer(artifactText);
    expect(inBrowser.outcomes).toEqual([...scorer.outcomes]);
    const batch = scorer.scoreBatch(columnsFromItems(scorer.features, items));
    let worst = 0;
    let identical = 0;
    let compared = 0;
    items.forEach((item, i) => {
      const result = scorer.scoreOne(item);
      const node = [
        ...scorer.outcomes.map((outcome) => result.probability[outcome]),
        result.combined,
      ];
      node.forEach((value, k) => {
        for (const other of [inBrowser.one[i][k], inBrowser.batch[k][i]]) {
          worst = Math.max(worst, Math.abs(other - value));
          identical += other === value ? 1 : 0;
          compared++;
        }
        const nodeBatch =
          k < scorer.outcomes.length ? batch.probability[scorer.outcomes[k]][i] : batch.combined[i];
        expect(nodeBatch).toBe(value);
      });
    });
    console.log(
      `browser vs Node: ${identical} of ${compared} numbers bit-identical, largest difference ${worst}`,
    );
    // Both run V8 with the same IEEE double arithmetic and Math.exp port; the parity bound (1e-12) is the tolerance.
    expect(worst).toBeLessThanOrEqual(1e-12);
    expect(inBrowser.rank).toEqual(Array.from(scorer.rank(items)));
  });
});
