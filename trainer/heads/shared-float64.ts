/**
 * A zeroed Float64Array on a SharedArrayBuffer, so worker threads can update it
 * in place (structured clone shares such memory instead of copying it).
 *
 * @example
 * const z = sharedFloat64(coordinates * heads);
 */
export function sharedFloat64(length: number): Float64Array {
  return new Float64Array(new SharedArrayBuffer(length * 8));
}
