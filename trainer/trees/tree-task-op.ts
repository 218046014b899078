/**
 * The operations a worker (or the main thread) runs over the shared training
 * buffers. A round is one op applied to a list of records; records touch
 * disjoint memory, so any split of a round across workers leaves the same bits.
 *
 * A round's Int32Array holds records back to back, each as
 * [fieldCount, cost, ...fields]; cost (rows) only guides the spread over workers.
 * The op's fields:
 * - gradients: [start, end, sumsSlot, position]: gradients, hessians and loss sums of rows
 *   start .. end - 1; position -1 writes them by row into gradHess, position >= 0 packs the
 *   training rows' pairs into `ordered` from that position (see logLossGradients).
 * - partition: [start, end, column, node, countSlot]: split a segment of buffers.rows (and
 *   its ordered gradients) in place.
 * - histogram: [histSlot, start0, end0, start1, end1, ...]: one block histogram over segments, from zero.
 * - addLeaf: [start, end, node]: add nodeValue[node] to the scores of rows[start .. end).
 * - addSplit: [start, end, column, node]: add the value of the child each row goes to.
 * - traverse: [start, end, depth]: score otherRows[start .. end) through the current tree.
 * - order: [start, end]: copy the gradient pairs of rows[start .. end) to their positions in `ordered`.
 */
export const TreeTaskOp = {
  gradients: 0,
  partition: 1,
  histogram: 2,
  addLeaf: 3,
  traverse: 4,
  order: 5,
  addSplit: 6,
} as const;

/**
 * Collects the records of one round.
 *
 * @example
 * const list = new TaskList();
 * list.add(1000, 0, 1000, 0); // a gradients record of rows 0 .. 999 into sums slot 0
 * list.ints(); // Int32Array [3, 1000, 0, 1000, 0]
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
