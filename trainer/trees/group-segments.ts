/**
 * Groups a node's [start, end) segments, in order, into blocks that close once
 * they hold `blockRows` rows. A block is the unit one worker sums from zero, so
 * the grouping (and with it every histogram's order of addition) depends only on
 * the segments, never on the number of workers.
 *
 * @example
 * groupSegments([0, 600, 1000, 1300, 2000, 2100], 500);
 * // [{ rows: 600, segments: [0, 600] }, { rows: 400, segments: [1000, 1300, 2000, 2100] }]
 */
export function groupSegments(
  segments: readonly number[],
  blockRows: number,
): { rows: number; segments: number[] }[] {
  const blocks: { rows: number; segments: number[] }[] = [];
  let current: { rows: number; segments: number[] } | null = null;
  for (let k = 0; k < segments.length; k += 2) {
    if (current === null) {
      current = { rows: 0, segments: [] };
      blocks.push(current);
    }
    current.segments.push(segments[k], segments[k + 1]);
    current.rows += segments[k + 1] - segments[k];
    if (current.rows >= blockRows) current = null;
  }
  return blocks;
}
