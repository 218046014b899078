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
    sampleRows: false,
    maxDepth: 2,
    histogramBlocks: 2,
    segments: 4,
    lossBlocks: 1,
  });

  it("run a round on two workers", async () => {
    const pool = new TreeTaskPool(buffers, 2);
    try {
      buffers.score.fill(0);
      buffers.rows.forEach((_, i) => (buffers.rows[i] = i));
      buffers.nodeValue.set([0.5, 0.25]);
      const tasks = new TaskList();
      tasks.add(50, 0, 50, 0); // rows 0 .. 49 get node 0's value
      tasks.add(50, 50, 100, 1);
      await pool.run(TreeTaskOp.addLeaf, tasks.ints());
      expect(Array.from(buffers.score)).toEqual([
        ...new Array<number>(50).fill(0.5),
        ...new Array<number>(50).fill(0.25),
      ]);
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
      await expect(pool.run(TreeTaskOp.addLeaf, tasks.ints())).rejects.toThrow(/worker thread/);
    } finally {
      await pool.close();
    }
  });
});
