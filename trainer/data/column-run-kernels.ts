import * as C from "./plan-columns.js";

/** How a slot's run of cells is checked and copied; RUN_ROW means "never in bulk, always row by row". */
export const RUN_ROW = 0;
export const RUN_FINITE = 1;
export const RUN_WEIGHT = 2;
export const RUN_PROBABILITY = 3;
export const RUN_LABEL = 4;
export const RUN_SECONDS = 5;
export const RUN_INDEXED_CATEGORY = 6;

// Kernels take only Float64Array numbers and Int32Array indices: one array type each keeps
// V8's element access monomorphic (mixed typed-array types cost ~30x in a probe here).

/** The bulk kind for a typed-number source of cell kind `cell` (epoch-ms sources only suit time cells). */
export function numberRunKind(cell: number, epochMs: boolean): number {
  if (epochMs) {
    const time = cell === C.CELL_TIME_S || cell === C.CELL_TIME_MS || cell === C.CELL_TIME_ISO;
    return time ? RUN_FINITE : RUN_ROW;
  }
  switch (cell) {
    case C.CELL_NUMBER:
    case C.CELL_TIME_MS:
      return RUN_FINITE;
    case C.CELL_WEIGHT:
      return RUN_WEIGHT;
    case C.CELL_PROBABILITY:
      return RUN_PROBABILITY;
    case C.CELL_LABEL:
      return RUN_LABEL;
    case C.CELL_TIME_S:
      return RUN_SECONDS;
    default:
      return RUN_ROW;
  }
}

/**
 * The end of the run of rows from `start` (before `end`) whose numbers the
 * bulk copy may take as they are: values the role accepts, or nulls where the
 * column allows missing values.
 *
 * @example
 * const stop = cleanRunEnd(RUN_FINITE, values, null, true, 0, 1000); // first non-finite row, or 1000
 */
export function cleanRunEnd(
  kind: number,
  numbers: Float64Array,
  valid: Uint8Array | null,
  allowMissing: boolean,
  start: number,
  end: number,
): number {
  // One small loop per case: a loop that meets a new case deoptimizes, and under load the
  // recompile can lag far behind, leaving the whole scan in the interpreter.
  if (valid === null && kind === RUN_FINITE) return finiteRunEnd(numbers, start, end);
  if (valid === null && kind === RUN_LABEL) return labelRunEnd(numbers, start, end);
  return checkedRunEnd(kind, numbers, valid, allowMissing, start, end);
}

function finiteRunEnd(numbers: Float64Array, start: number, end: number): number {
  let r = start;
  while (r < end && numbers[r] - numbers[r] === 0) r++;
  return r;
}

function labelRunEnd(numbers: Float64Array, start: number, end: number): number {
  let r = start;
  while (r < end && (numbers[r] === 0 || numbers[r] === 1)) r++;
  return r;
}

function checkedRunEnd(
  kind: number,
  numbers: Float64Array,
  valid: Uint8Array | null,
  allowMissing: boolean,
  start: number,
  end: number,
): number {
  let r = start;
  for (; r < end; r++) {
    if (valid !== null && valid[r] === 0) {
      if (!allowMissing) return r;
    } else if (!isClean(kind, numbers[r])) return r;
  }
  return r;
}

/** The end of the run of rows whose dictionary index already has a category code in `codeMap` (or is an allowed null). */
export function cleanIndexRunEnd(
  indices: Int32Array,
  codeMap: Int32Array,
  valid: Uint8Array | null,
  allowMissing: boolean,
  start: number,
  end: number,
): number {
  let r = start;
  if (valid === null) {
    while (r < end && codeMap[indices[r]] >= 0) r++;
    return r;
  }
  for (; r < end; r++) {
    if (valid[r] === 0 ? !allowMissing : codeMap[indices[r]] < 0) return r;
  }
  return r;
}

function isClean(kind: number, v: number): boolean {
  switch (kind) {
    case RUN_FINITE:
      return v - v === 0;
    case RUN_WEIGHT:
      return v >= 0 && v < Infinity;
    case RUN_PROBABILITY:
      return v >= 0 && v <= 1;
    case RUN_LABEL:
      return v === 0 || v === 1;
    case RUN_SECONDS:
      return v * 1000 - v * 1000 === 0;
    default:
      return false;
  }
}

/**
 * Copies the clean rows `[start, start + count)` of a number source into the
 * batch column at row `at`: numbers (seconds scaled to milliseconds, nulls as
 * NaN) or labels.
 *
 * @example
 * copyRun(RUN_FINITE, values, null, target, noLabels, 0, 512, batchRow);
 */
export function copyRun(
  kind: number,
  numbers: Float64Array,
  valid: Uint8Array | null,
  target: Float64Array,
  labels: Uint8Array,
  start: number,
  count: number,
  at: number,
): void {
  const end = start + count;
  if (kind === RUN_LABEL) {
    // Labels are never missing in a clean run.
    labels.set(numbers.subarray(start, end), at);
  } else if (kind === RUN_SECONDS) {
    for (let r = start; r < end; r++) {
      target[at + r - start] = valid !== null && valid[r] === 0 ? Number.NaN : numbers[r] * 1000;
    }
  } else {
    target.set(numbers.subarray(start, end), at);
    if (valid !== null) {
      for (let r = start; r < end; r++) if (valid[r] === 0) target[at + r - start] = Number.NaN;
    }
  }
}

/** Copies the category codes of the clean rows `[start, start + count)` through `codeMap` (nulls as -1). */
export function copyIndexRun(
  indices: Int32Array,
  codeMap: Int32Array,
  valid: Uint8Array | null,
  codes: Int32Array,
  start: number,
  count: number,
  at: number,
): void {
  for (let i = 0; i < count; i++) {
    const r = start + i;
    codes[at + i] = valid !== null && valid[r] === 0 ? -1 : codeMap[indices[r]];
  }
}
