import type { BatchBuilder } from "./batch-builder.js";
import {
  RUN_INDEXED_CATEGORY,
  RUN_ROW,
  cleanIndexRunEnd,
  cleanRunEnd,
  copyIndexRun,
  copyRun,
  numberRunKind,
} from "./column-run-kernels.js";
import { CELL_CATEGORY, CELL_LABEL } from "./plan-columns.js";

/** One column of a columnar chunk (a Parquet row group, an Arrow record batch), as the feeder reads it. */
export interface ColumnSource {
  /** Plain numbers, when the column decodes to them. */
  readonly numbers: Float64Array | null;
  /** Anything else: strings, bigints, booleans, Dates, nulls. */
  readonly values: ArrayLike<unknown> | null;
  /** Dictionary-encoded text: per row an index into `texts`. */
  readonly indices: Int32Array | null;
  readonly texts: readonly (string | null)[] | null;
  /** With `texts`: per dictionary entry its category code once known, else -1 (filled as rows are read). */
  readonly codeMap: Int32Array | null;
  /** 0 where the row's value is null (for `numbers` and `indices`, whose nulls would read as 0). */
  readonly valid: Uint8Array | null;
  /** `numbers` are instants in epoch milliseconds (timestamps and dates). */
  readonly epochMs: boolean;
  /** `numbers` are booleans as 0 and 1: labels in bulk, but "true"/"false" (and refused as numbers) row by row. */
  readonly booleans: boolean;
}

/**
 * Hands rows `[from, to)` of columnar sources (one per builder slot) to the
 * batch builder; stops when the batch is full and returns the first row not
 * fed. Runs of rows whose every cell is clean (a value the role accepts, or an
 * allowed null) are copied column by column in bulk; a row with anything else
 * goes cell by cell through the builder, so a bad cell rejects exactly its row
 * with the usual message. Row numbers are `rowBase + index + 1`.
 *
 * @example
 * let at = 0;
 * while ((at = feedColumnRows(builder, sources, at, rows, groupStart)) < rows) yield builder.take();
 */
export function feedColumnRows(
  b: BatchBuilder,
  sources: readonly ColumnSource[],
  from: number,
  to: number,
  rowBase: number,
): number {
  const width = sources.length;
  const kinds = sources.map((source, slot) => runKind(b, source, slot));
  const allowMissing = b.slots.map((s) => s.column.allowMissing && s.cell !== CELL_LABEL);
  // Per slot, rows [r, scanEnd) are known clean, and row scanEnd is known bad when scanDirty:
  // each cell is scanned once, however the slots' runs interleave.
  const scanEnd = new Float64Array(width).fill(from);
  const scanDirty = new Uint8Array(width);
  let r = from;
  while (r < to) {
    if (b.rowCount === b.capacity) return r;
    const limit = r + Math.min(to - r, b.capacity - b.rowCount);
    let cleanEnd = limit;
    for (let slot = 0; slot < width && cleanEnd > r; slot++) {
      const kind = kinds[slot];
      if (kind === RUN_ROW) {
        cleanEnd = r;
        break;
      }
      let end = Math.max(scanEnd[slot], r);
      if (scanDirty[slot] === 0 && end < limit) {
        const source = sources[slot];
        end =
          kind === RUN_INDEXED_CATEGORY
            ? cleanIndexRunEnd(
                source.indices as Int32Array,
                source.codeMap as Int32Array,
                source.valid,
                allowMissing[slot],
                end,
                limit,
              )
            : cleanRunEnd(
                kind,
                source.numbers as Float64Array,
                source.valid,
                allowMissing[slot],
                end,
                limit,
              );
        scanEnd[slot] = end;
        scanDirty[slot] = end < limit ? 1 : 0;
      }
      if (end < cleanEnd) cleanEnd = end;
    }
    if (cleanEnd > r) {
      copyRows(b, sources, kinds, r, cleanEnd - r);
      r = cleanEnd;
    } else {
      feedRow(b, sources, r, rowBase);
      r++;
      // Slots whose first bad row was this one scan on from the next row.
      for (let slot = 0; slot < width; slot++) {
        if (scanEnd[slot] < r) {
          scanEnd[slot] = r;
          scanDirty[slot] = 0;
        }
      }
    }
  }
  return r;
}

/** Copies `count` clean rows from row `r` of every source into the batch, column by column. */
function copyRows(
  b: BatchBuilder,
  sources: readonly ColumnSource[],
  kinds: readonly number[],
  r: number,
  count: number,
): void {
  const at = b.rowCount;
  for (let slot = 0; slot < sources.length; slot++) {
    const source = sources[slot];
    if (kinds[slot] === RUN_INDEXED_CATEGORY) {
      const indices = source.indices as Int32Array;
      const map = source.codeMap as Int32Array;
      copyIndexRun(indices, map, source.valid, b.codes[slot], r, count, at);
    } else {
      const numbers = source.numbers as Float64Array;
      copyRun(kinds[slot], numbers, source.valid, b.numbers[slot], b.labels[slot], r, count, at);
    }
  }
  b.commitWritten(count);
}

function runKind(b: BatchBuilder, source: ColumnSource, slot: number): number {
  const cell = b.slots[slot].cell;
  if (source.indices !== null) return cell === CELL_CATEGORY ? RUN_INDEXED_CATEGORY : RUN_ROW;
  if (source.numbers === null || b.numericMarker[slot] === 1) return RUN_ROW;
  if (source.booleans) return cell === CELL_LABEL ? numberRunKind(cell, false) : RUN_ROW;
  return numberRunKind(cell, source.epochMs);
}

/** One row, cell by cell through the builder's checks; commits or rejects it. */
function feedRow(
  b: BatchBuilder,
  sources: readonly ColumnSource[],
  r: number,
  rowBase: number,
): void {
  for (let slot = 0; slot < sources.length; slot++) {
    const source = sources[slot];
    if (source.valid !== null && source.valid[r] === 0) {
      b.missingCell(slot, "null");
    } else if (source.indices !== null) {
      const index = source.indices[r];
      const text = (source.texts as readonly (string | null)[])[index];
      const map = source.codeMap as Int32Array;
      if (map[index] >= 0) b.categoryCode(slot, map[index]);
      else if (typeof text !== "string") b.valueCell(slot, text);
      else {
        b.textCell(slot, text);
        // Known once an earlier row committed it; from then on the bulk path codes it.
        const dictionary = b.slots[slot].dictionary;
        if (dictionary !== null && !b.isMissingText(slot, text))
          map[index] = dictionary.lookup(text);
      }
    } else if (source.numbers !== null) {
      const value = source.numbers[r];
      if (source.epochMs) b.timeCell(slot, value, new Date(value));
      else if (source.booleans) b.valueCell(slot, value === 1);
      else b.numberCell(slot, value);
    } else {
      b.valueCell(slot, (source.values as ArrayLike<unknown>)[r]);
    }
  }
  if (b.rowBad) b.rejectRow(rowBase + r + 1, rawRow(b, sources, r));
  else b.commitRow();
}

/** The row's values as JSON, for the rejects file. */
function rawRow(b: BatchBuilder, sources: readonly ColumnSource[], r: number): string {
  // No prototype: a column named "__proto__" must become a key, not replace the prototype.
  const row = Object.create(null) as Record<string, unknown>;
  sources.forEach((source, slot) => {
    const name = b.slots[slot].name;
    if (source.valid !== null && source.valid[r] === 0) row[name] = null;
    else if (source.indices !== null) row[name] = source.texts?.[source.indices[r]];
    else if (source.numbers !== null) {
      const value = source.numbers[r];
      if (source.booleans) row[name] = value === 1;
      else
        row[name] =
          source.epochMs && Number.isFinite(value) ? new Date(value).toISOString() : value;
    } else row[name] = (source.values as ArrayLike<unknown>)[r];
  });
  return JSON.stringify(row, (_key, value: unknown) => {
    if (typeof value === "bigint") return String(value);
    if (typeof value === "number" && !Number.isFinite(value)) return String(value);
    return value;
  });
}
