/**
 * Run counts and seeds of the fuzz properties. By default each run draws a new
 * seed (fast-check prints the seed and path of any failure, to replay it);
 * LEAFCAST_FUZZ_SEED fixes the seed, and LEAFCAST_FUZZ_SCALE multiplies the
 * number of cases for a longer hunt than CI affords.
 *
 * @example
 * fc.assert(property, fuzzParams(2000)); // { numRuns: 2000 } unless the environment says more
 */
export function fuzzParams(numRuns: number): { numRuns: number; seed?: number } {
  const scale = Number(process.env.LEAFCAST_FUZZ_SCALE ?? "1");
  const runs = Math.max(1, Math.round(numRuns * (Number.isFinite(scale) && scale > 0 ? scale : 1)));
  const seed = process.env.LEAFCAST_FUZZ_SEED;
  return seed === undefined || seed === ""
    ? { numRuns: runs }
    : { numRuns: runs, seed: Number(seed) };
}
