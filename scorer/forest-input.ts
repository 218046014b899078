/**
 * Inputs for evaluating a forest on its own, already in the contract's terms
 * (the trainer's tree learner and leaf encoder hold data this way).
 *
 * Feature-major: one Float64Array per numeric feature (NaN: missing) and one
 * Int32Array of tree codes per categorical feature (position in the contract's
 * values; -1 or a code past the values: missing), both in contract order.
 *
 * @example
 * const input: ForestColumns = { rowCount: 2, numeric: [Float64Array.of(0.4, NaN)], categorical: [Int32Array.of(0, -1)] };
 */
export interface ForestColumns {
  readonly rowCount: number;
  readonly numeric: readonly Float64Array[];
  readonly categorical: readonly Int32Array[];
}

/**
 * Row-major: row i's feature f (contract index) at values[i * featureCount + f];
 * categorical features hold their tree code as a number (NaN, -1 or a code past
 * the values: missing). A single item is a ForestRows of one row.
 *
 * @example
 * const one: ForestRows = { rowCount: 1, values: Float64Array.of(0.4, 0) };
 */
export interface ForestRows {
  readonly rowCount: number;
  readonly values: Float64Array;
}
