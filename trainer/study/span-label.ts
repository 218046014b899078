/**
 * A run of day files for people: "day 3" or "days 3-5" (1-based file numbers).
 *
 * @example
 * spanLabel(8, 14); // "days 8-14"
 */
export function spanLabel(first: number, last: number): string {
  return first === last ? `day ${first}` : `days ${first}-${last}`;
}
