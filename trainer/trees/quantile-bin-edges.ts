/**
 * Upper bin edges for one numeric feature from a sorted sample of its finite
 * values. Bin b holds the raw values x with edges[b - 1] < x <= edges[b]; the
 * last edge is the largest finite number, so every finite value has a bin and
 * every edge (hence every split threshold) is a plain JSON number. A split "bin <= b goes left"
 * is therefore the raw rule "x > edges[b] goes right", which is what the scorer
 * applies: the same value lands on the same side in training and in serving.
 *
 * With at most `maxBins` distinct values every value gets its own bin; otherwise
 * bins are closed greedily near equal shares of the sample (a value is never
 * split across bins, so a heavy value simply fills a bin of its own). Edges sit
 * halfway between neighbouring sample values, so a value unseen in the sample
 * goes with its nearer neighbour.
 *
 * @example
 * quantileBinEdges(Float64Array.of(1, 1, 2, 3), 255); // Float64Array [1.5, 2.5, Number.MAX_VALUE]
 */
export function quantileBinEdges(sorted: Float64Array, maxBins: number): Float64Array {
  const n = sorted.length;
  if (n === 0) return Float64Array.of(Number.MAX_VALUE);
  // Distinct values and their counts, in ascending order.
  let m = 1;
  for (let i = 1; i < n; i++) if (sorted[i] !== sorted[i - 1]) m++;
  const values = new Float64Array(m);
  const counts = new Float64Array(m);
  values[0] = sorted[0];
  for (let i = 0, d = 0; i < n; i++) {
    if (sorted[i] !== values[d]) values[++d] = sorted[i];
    counts[d]++;
  }
  const edges: number[] = [];
  if (m <= maxBins) {
    for (let i = 0; i + 1 < m; i++) edges.push(edgeBetween(values[i], values[i + 1]));
  } else {
    let binsLeft = maxBins;
    let rest = n;
    let filled = 0;
    for (let i = 0; i < m; i++) {
      const target = rest / binsLeft;
      // Close the open bin before value i when adding it would land further from the
      // even share than stopping now does.
      if (filled > 0 && binsLeft > 1 && filled + counts[i] - target > target - filled) {
        edges.push(edgeBetween(values[i - 1], values[i]));
        rest -= filled;
        filled = 0;
        binsLeft--;
      }
      filled += counts[i];
    }
  }
  edges.push(Number.MAX_VALUE);
  return Float64Array.from(edges);
}

/** A value e with a <= e < b, halfway when floating point allows. */
function edgeBetween(a: number, b: number): number {
  const mid = 0.5 * a + 0.5 * b;
  return mid >= a && mid < b ? mid : a;
}
