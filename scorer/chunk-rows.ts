/**
 * Rows per pass through the kernels for a row-block stride: up to 256, fewer when
 * rows are wide (many features or virtual slots), so that the number block of a
 * pass stays near 64 KiB and in cache while the forests walk it.
 *
 * @example
 * chunkRows(34); // 240
 * chunkRows(600); // 16
 */
export function chunkRows(stride: number): number {
  return Math.max(16, Math.min(256, Math.floor(8192 / stride)));
}
