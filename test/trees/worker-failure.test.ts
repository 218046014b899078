import { describe, expect, it } from "vitest";
import { LeafcastError } from "../../trainer/errors.js";
import { createTrainingBuffers } from "../../trainer/trees/training-buffers.js";
import { TreeTaskPool } from "../../trainer/trees/tree-task-pool.js";
import { TaskList, TreeTaskOp } from "../../trainer/trees/tree-task-op.js";

// Worker threads: a worker that throws must surface as a clear LeafcastError, and
// closing the pool must end the threads (the test process would otherwise hang).
describe("tree worker threads", () => {
  const buffers = createTrainingBuffers(new Uint8Array(new SharedArrayBuffer(100)), {
    rowCount: 100,
    columnCount: 1,
    blockRows: 64,
    hasWeight: false,
    hasValidation: false,
    sampleRows: true,
    maxDepth: 2,
    histogramBlocks: 2,
    segments: 4,
    lossBlocks: 2,
  });

  it("run a round on two workers", async () => {
    const pool = new TreeTaskPool(buffers, 2);
    try {
      // Scores 0 and labels 1 then 0: gradients p - y = -0.5 and 0.5, hessians 0.25.
      buffers.score.fill(0);
      buffers.label.fill(1, 0, 50);
      buffers.label.fill(0, 50, 100);
      const tasks = new TaskList();
      tasks.add(50, 0, 50, 0, -1, -1, -1); // rows 0 .. 49 into loss slot 0, by row
      tasks.add(50, 50, 100, 1, -1, -1, -1);
      await pool.run(TreeTaskOp.gradients, tasks.ints());
      expect(Array.from(buffers.gradHess)).toEqual([
        ...new Array<number[]>(50).fill([-0.5, 0.25]).flat(),
        ...new Array<number[]>(50).fill([0.5, 0.25]).flat(),
      ]);
      // Both slots: 50 rows of loss log 2 each (the logistic loss at p = 1/2).
      expect(Math.abs(buffers.sums[0] - 50 * Math.LN2)).toBeLessThan(1e-12);
      expect(Math.abs(buffers.sums[4] - 50 * Math.LN2)).toBeLessThan(1e-12);
    } finally {
      await pool.close();
    }
  });

  it("reject a round whose worker throws, with the worker's message", async () => {
    const pool = new TreeTaskPool(buffers, 2);
    try {
      const tasks = new TaskList();
      tasks.add(10, 0, 10);
      const round = pool.run(99, tasks.ints());
      await expect(round).rejects.toBeInstanceOf(LeafcastError);
      await expect(round).rejects.toThrow(
        /trees: worker thread \d failed: Error: trees: unknown task op 99/,
      );
      await expect(pool.run(TreeTaskOp.gradients, tasks.ints())).rejects.toThrow(/worker thread/);
    } finally {
      await pool.close();
    }
  });
});
