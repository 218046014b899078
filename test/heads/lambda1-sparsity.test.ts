import { describe, expect, it } from "vitest";
import { exportHeadModels } from "../../trainer/heads/export-head-models.js";
import { learnHeads } from "../../trainer/heads/learn-heads.js";
import { encodedRows, headBatch, headSetup, uniform } from "./head-fixtures.js";

// Source: McMahan et al., KDD 2013: FTRL-Proximal's L1 term (lambda1) is what makes
// the learned model sparse; a larger lambda1 keeps fewer non-zero weights.
describe("lambda1 and sparsity", () => {
  it("gives fewer non-zero weights as lambda1 grows over a grid", async () => {
    const random = uniform(9);
    const features = 400;
    const truth = Array.from({ length: features }, (_, j) => (j % 4 === 0 ? random() * 4 - 2 : 0));
    const rows: number[][] = [];
    const labels: number[] = [];
    for (let i = 0; i < 4000; i++) {
      const row = [
        ...new Set(Array.from({ length: 6 }, () => Math.floor(random() * features))),
      ].sort((a, b) => a - b);
      const logit = -1 + row.reduce((sum, j) => sum + truth[j], 0);
      rows.push(row);
      labels.push(random() < 1 / (1 + Math.exp(-logit)) ? 1 : 0);
    }
    const batch = headBatch(encodedRows(rows), [labels]);
    const counts: number[] = [];
    for (const lambda1 of [0, 0.5, 1, 2, 4, 8, 16, 32]) {
      const setup = headSetup(["y"], features, { alpha: 0.1, beta: 1, lambda1, lambda2: 1 });
      const state = await learnHeads([batch, batch, batch], setup, { workers: 0 });
      counts.push(exportHeadModels(state)[0].index.length);
    }
    for (let i = 1; i < counts.length; i++) expect(counts[i]).toBeLessThan(counts[i - 1]);
    expect(counts[0]).toBeGreaterThan(300);
    expect(counts[counts.length - 1]).toBeLessThan(counts[0] / 4);
  });
});
