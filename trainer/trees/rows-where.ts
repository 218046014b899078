/**
 * The ascending row indexes r < n with mask[r] === value; with no mask every row
 * counts as 0.
 *
 * @example
 * rowsWhere(Uint8Array.of(0, 1, 0), 0, 3); // Uint32Array [0, 2]
 */
export function rowsWhere(mask: Uint8Array | null, value: number, n: number): Uint32Array {
  if (mask === null) {
    const rows = new Uint32Array(value === 0 ? n : 0);
    for (let r = 0; r < rows.length; r++) rows[r] = r;
    return rows;
  }
  let count = 0;
  for (let r = 0; r < n; r++) if (mask[r] === value) count++;
  const rows = new Uint32Array(count);
  for (let r = 0, i = 0; r < n; r++) if (mask[r] === value) rows[i++] = r;
  return rows;
}
