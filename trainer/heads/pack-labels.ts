/**
 * Copies per-head label arrays into one [head][row] array, the form the kernels
 * and worker threads read.
 *
 * @example
 * packLabels([openLabels, replyLabels], rowCount, packed); // packed[1 * rowCount + r] = replyLabels[r]
 */
export function packLabels(labels: readonly Uint8Array[], rowCount: number, out: Uint8Array): void {
  labels.forEach((column, head) => out.set(column.subarray(0, rowCount), head * rowCount));
}
