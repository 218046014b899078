import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { generatePlotline, type PlotlineChunk } from "../../datasets/plotline/generate-plotline.js";
import {
  generatesOnWorker,
  plotlineChunksAhead,
} from "../../datasets/plotline/plotline-chunks-ahead.js";

// Ground truth from the project's own generator: generating on a worker thread
// must give exactly the rows generated on the calling thread (same bytes).
const options = { seed: 11, days: 3, rowsPerDay: 70_000, chunkRows: 16_384 };

function digest(chunks: Iterable<PlotlineChunk>): Map<string, string> {
  const hashes = new Map<string, ReturnType<typeof createHash>>();
  for (const chunk of chunks) {
    for (const [name, values] of Object.entries(chunk.columns)) {
      const hash = hashes.get(name) ?? createHash("sha256");
      const used = values.subarray(0, chunk.rowCount);
      hash.update(new Uint8Array(used.buffer, used.byteOffset, used.byteLength));
      hashes.set(name, hash);
    }
  }
  return new Map([...hashes].map(([name, hash]) => [name, hash.digest("hex")]));
}

describe("plotlineChunksAhead", () => {
  it.each([1, 3])(
    "generates on %i worker(s) exactly the rows of generatePlotline",
    async (threads) => {
      expect(generatesOnWorker(options)).toBe(true);
      const ahead: PlotlineChunk[] = [];
      for await (const chunk of plotlineChunksAhead(options, threads, 2)) ahead.push(chunk);
      expect(ahead.reduce((rows, chunk) => rows + chunk.rowCount, 0)).toBe(210_000);
      expect(ahead.map((chunk) => chunk.firstRow)).toEqual(
        Array.from({ length: 13 }, (_, c) => c * 16_384),
      );
      expect(digest(ahead)).toEqual(digest(generatePlotline(options, false)));
    },
  );

  it("stops its worker when the caller stops early", async () => {
    let seen = 0;
    for await (const chunk of plotlineChunksAhead(options, 2, 3)) {
      seen += chunk.rowCount;
      if (seen >= 32_768) break;
    }
    expect(seen).toBe(32_768);
  });

  it("generates small runs on the calling thread", () => {
    expect(generatesOnWorker({ rows: 1000 })).toBe(false);
  });
});
