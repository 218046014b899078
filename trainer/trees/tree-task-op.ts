/**
 * The operations a worker (or the main thread) runs over the shared training
 * buffers. A round is one op applied to a list of records; records touch
 * disjoint memory, so any split of a round across workers leaves the same bits.
 *
 * A round's Int32Array holds records back to back, each as
 * [fieldCount, cost, ...fields]; cost (rows) only sets the order in which workers take them.
 * The op's fields:
 * - gradients: [start, end, sumsSlot, position, histSlot, treeDepth]: with treeDepth >= 0 first
 *   adds the current tree (nodeColumn, goesRight, leafValue; that depth) to the scores of rows
 *   start .. end - 1 (addTreeToScores), then their gradients, hessians and loss sums; position -1
 *   writes them by row into gradHess, position >= 0 packs the training rows' pairs into `ordered`
 *   from that position (see logLossGradients) and their bins into `placed`: the next tree's root;
 *   with histSlot >= 0 also the histogram of those packed rows, from zero, into that block histogram.
 * - partition: [histSlot, smallerSide, column, node, countSlot, start0, end0, start1, end1, ...]:
 *   split each segment of one node in place (ordered gradients and placed bins; left
 *   counts to counts[countSlot], counts[countSlot + 1], ...) and, with histSlot >= 0, sum the
 *   smaller child's part of every segment (side 0 left, 1 right) into that block histogram.
 * - histogram: [histSlot, start0, end0, start1, end1, ...]: one block histogram over segments, from zero.
 * - place: [start, end, gradients]: copy the bins of rows[start .. end) to their positions in
 *   `placed` and, with gradients 1, their pairs from gradHess to `ordered`.
 */
export const TreeTaskOp = {
  gradients: 0,
  partition: 1,
  histogram: 2,
  place: 3,
} as const;

/**
 * Collects the records of one round.
 *
 * @example
 * const list = new TaskList();
 * list.add(1000, 0, 1000, 0, -1, -1, -1); // a gradients record of rows 0 .. 999 into sums slot 0
 * list.ints(); // Int32Array [6, 1000, 0, 1000, 0, -1, -1, -1]
 */
export class TaskList {
  private readonly fields: number[] = [];
  private records = 0;

  /** Records added so far. */
  get length(): number {
    return this.records;
  }

  /** Adds a record of `fields` that costs about `cost` rows of work. */
  add(cost: number, ...fields: number[]): void {
    this.fields.push(fields.length, cost, ...fields);
    this.records++;
  }

  ints(): Int32Array {
    return Int32Array.from(this.fields);
  }
}
