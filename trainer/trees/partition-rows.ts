/**
 * Splits the positions start .. end - 1 of a node segment in place: rows whose bin
 * in `column` has a 0 in the node's 256-entry table `goesRight` (from tableBase)
 * come first, the others after them, each side in its old order (stable, so a
 * block of rows always sums the same way). Everything kept by position moves
 * with its row: the gradient pair in `ordered` (position i at 2i, 2i + 1) and
 * the row's bins in `placed` (position i at i * stride bytes, moved as `words`,
 * stride / 4 words per row), so that a child's histogram and its next partition
 * read memory sequentially. Row indexes do not travel: scores are updated by
 * sending rows down the finished tree in row order (addTreeToScores), which
 * made each partition move 24 bytes per row instead of 28.
 * Returns the number of left rows.
 *
 * Branchless: every row is written both at the left cursor (which never passes
 * the read cursor) and into the right scratch, and only one cursor moves; split
 * directions look random to a branch predictor, which made a branchy loop four
 * times slower in a probe here. The scratch buffers hold at least end - start
 * rows. Kernel: no checks, no allocation.
 *
 * @example
 * // 4 rows, one column (stride 4: one word per row) with bins [3, 0, 7, 1]; bins above 2 go right.
 * const table = new Uint8Array(256).fill(1, 3);
 * const words = Uint32Array.of(3, 0, 7, 1);
 * const placed = new Uint8Array(words.buffer);
 * const ordered = Float64Array.of(0, 0, 1, 1, 2, 2, 3, 3);
 * partitionRows(placed, words, 4, ordered, 0, 4, 0, table, 0, new Float64Array(8), new Uint32Array(4));
 * // 2, ordered = [1, 1, 3, 3, 0, 0, 2, 2], words = [0, 1, 3, 7]
 */
export function partitionRows(
  placed: Uint8Array,
  words: Uint32Array,
  stride: number,
  ordered: Float64Array,
  start: number,
  end: number,
  column: number,
  goesRight: Uint8Array,
  tableBase: number,
  gradScratch: Float64Array,
  wordScratch: Uint32Array,
): number {
  const left = splitSegment(
    placed,
    words,
    stride,
    ordered,
    start,
    end,
    column,
    goesRight,
    tableBase,
    gradScratch,
    wordScratch,
  );
  const right = end - left;
  const w = stride >> 2;
  ordered.set(gradScratch.subarray(0, 2 * right), 2 * left);
  words.set(wordScratch.subarray(0, w * right), w * left);
  return left - start;
}

/**
 * The loop of partitionRows; returns the end of the left rows. A function of its
 * own with nothing after the loop: V8 compiles a long first call in the middle of
 * its loop, before the code after the loop has run, and the copies that used to
 * follow the loop here then threw that code away again on every call (dozens of
 * deoptimizations per fit, seen with --trace-deopt).
 */
function splitSegment(
  placed: Uint8Array,
  words: Uint32Array,
  stride: number,
  ordered: Float64Array,
  start: number,
  end: number,
  column: number,
  goesRight: Uint8Array,
  tableBase: number,
  gradScratch: Float64Array,
  wordScratch: Uint32Array,
): number {
  const w = stride >> 2;
  let left = start;
  let right = 0;
  if (w === 2 && LITTLE_ENDIAN) {
    // Eight columns or fewer: two words per row, unrolled, and the split column's bin
    // taken out of the word already loaded (byte k of a word is column 4 word + k on a
    // little-endian machine): about 10 % faster than reading the byte again in a probe here.
    const high = column >= 4;
    const shift = 8 * (column & 3);
    for (let i = start; i < end; i++) {
      const g = ordered[2 * i];
      const h = ordered[2 * i + 1];
      const a = words[2 * i];
      const b = words[2 * i + 1];
      const toRight = goesRight[tableBase + (((high ? b : a) >>> shift) & 255)];
      ordered[2 * left] = g;
      ordered[2 * left + 1] = h;
      words[2 * left] = a;
      words[2 * left + 1] = b;
      gradScratch[2 * right] = g;
      gradScratch[2 * right + 1] = h;
      wordScratch[2 * right] = a;
      wordScratch[2 * right + 1] = b;
      left += 1 - toRight;
      right += toRight;
    }
  } else {
    for (let i = start; i < end; i++) {
      const g = ordered[2 * i];
      const h = ordered[2 * i + 1];
      const toRight = goesRight[tableBase + placed[i * stride + column]];
      ordered[2 * left] = g;
      ordered[2 * left + 1] = h;
      gradScratch[2 * right] = g;
      gradScratch[2 * right + 1] = h;
      for (let k = 0; k < w; k++) {
        const x = words[w * i + k];
        words[w * left + k] = x;
        wordScratch[w * right + k] = x;
      }
      left += 1 - toRight;
      right += toRight;
    }
  }
  return left;
}

/** Whether typed arrays are little-endian here (they are on x64 and arm64). */
const LITTLE_ENDIAN = new Uint8Array(Uint32Array.of(1).buffer)[0] === 1;
