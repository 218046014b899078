import { LeafcastError, type Issue } from "../errors.js";
import type { HeadBatch } from "./head-setup.js";

/**
 * Checks a batch before any of it reaches a training kernel (kernels trust their
 * input: an index out of range would silently read or skip memory) and returns
 * its longest row. `batchNumber` (1-based) labels errors; rows in messages are
 * 1-based within the batch. Each kind of problem is reported once, with its
 * first occurrence and how many more there are.
 *
 * @example
 * const maxRowLength = checkHeadBatch(batch, 6, indexSize, 3);
 */
export function checkHeadBatch(
  batch: HeadBatch,
  headCount: number,
  indexSize: number,
  batchNumber: number,
): number {
  const issues: Issue[] = [];
  const where = `batch ${batchNumber}`;
  const bad = (code: string, message: string, row?: number): void => {
    issues.push({ code, message: `${where}: ${message}`, ...(row === undefined ? {} : { row }) });
  };
  const { rowCount, offsets, index, value } = batch.encoded;
  if (!Number.isInteger(rowCount) || rowCount < 0)
    bad("bad_batch", `expected a row count, found ${rowCount}`);
  if (offsets.length !== rowCount + 1 || offsets[0] !== 0) {
    bad(
      "bad_offsets",
      `expected ${rowCount + 1} row offsets starting at 0, found ${offsets.length}`,
    );
    throw new LeafcastError("heads", issues);
  }
  let maxRowLength = 0;
  for (let r = 0; r < rowCount; r++) {
    const length = offsets[r + 1] - offsets[r];
    if (length < 0) {
      bad(
        "bad_offsets",
        `expected row offsets that never decrease, found ${offsets[r]} then ${offsets[r + 1]}`,
        r + 1,
      );
      break;
    }
    if (length > maxRowLength) maxRowLength = length;
  }
  const entries = offsets[rowCount];
  if (entries > index.length || (value !== null && entries > value.length)) {
    bad(
      "bad_entries",
      `expected ${entries} entries, found ${index.length} indexes and ${value?.length ?? "no"} values`,
    );
  }
  if (issues.length > 0) throw new LeafcastError("heads", issues);
  // The one check that reads every entry: a plain loop, ~1 ns per entry.
  let badIndexes = 0;
  let firstBadIndex = -1;
  for (let k = 0; k < entries; k++) {
    const i = index[k];
    if (i < 0 || i >= indexSize) {
      if (badIndexes++ === 0) firstBadIndex = k;
    }
  }
  if (badIndexes > 0) {
    const k = firstBadIndex;
    bad(
      "bad_index",
      `expected encoded indexes in [0, ${indexSize}), found ${index[k]} at entry ${k}${more(badIndexes)}`,
    );
  }
  if (value !== null) {
    const badValue = firstBad(entries, (k) => !Number.isFinite(value[k]));
    if (badValue.count > 0) {
      const k = badValue.first;
      bad(
        "bad_value",
        `expected finite feature values, found ${value[k]} at entry ${k}${more(badValue.count)}`,
      );
    }
  }
  if (batch.labels.length !== headCount) {
    bad("bad_labels", `expected labels for ${headCount} heads, found ${batch.labels.length}`);
  }
  batch.labels.forEach((labels, head) => {
    if (labels.length !== rowCount) {
      bad("bad_labels", `head ${head} expected ${rowCount} labels, found ${labels.length}`);
      return;
    }
    const badLabel = firstBad(rowCount, (r) => labels[r] > 1);
    if (badLabel.count > 0) {
      const r = badLabel.first;
      bad(
        "bad_labels",
        `head ${head} expected labels 0 or 1, found ${labels[r]}${more(badLabel.count)}`,
        r + 1,
      );
    }
  });
  const { weights, timestamps } = batch;
  if (weights !== null) {
    if (weights.length !== rowCount)
      bad("bad_weights", `expected ${rowCount} weights, found ${weights.length}`);
    else {
      const badWeight = firstBad(rowCount, (r) => !(weights[r] >= 0 && weights[r] < Infinity));
      if (badWeight.count > 0) {
        const r = badWeight.first;
        bad(
          "bad_weights",
          `expected finite weights >= 0, found ${weights[r]}${more(badWeight.count)}`,
          r + 1,
        );
      }
    }
  }
  if (timestamps !== null && timestamps.length !== rowCount) {
    bad("bad_timestamps", `expected ${rowCount} timestamps, found ${timestamps.length}`);
  }
  if (issues.length > 0) throw new LeafcastError("heads", issues);
  return maxRowLength;
}

/** How many of 0..count-1 fail, and the first that does. */
function firstBad(count: number, fails: (i: number) => boolean): { first: number; count: number } {
  let first = -1;
  let failed = 0;
  for (let i = 0; i < count; i++) {
    if (fails(i)) {
      if (failed === 0) first = i;
      failed++;
    }
  }
  return { first, count: failed };
}

function more(count: number): string {
  return count > 1 ? ` (and ${count - 1} more)` : "";
}
