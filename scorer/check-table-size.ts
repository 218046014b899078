import type { FeatureContract, ForestModel } from "./model-types.js";
import type { ScorerIssue } from "./scorer-error.js";

/**
 * The most the compiled tables of one model may take. A few bytes of artifact
 * can demand far more table than they hold: every categorical node of a forest
 * gets a bitset region as wide as the forest's largest categorical feature
 * (4,096 words at 65,536 values), and every leaf a row of head weights (up to
 * 64 lanes of 8 bytes), so a 10 MB file could otherwise ask for 16 GB.
 */
export const MAX_TABLE_BYTES = 2 ** 30;

/**
 * Estimates the bytes of the tables compileForest and compileHeads would build
 * for these forests and `headCount` heads (0 for forests scored alone) and
 * refuses more than MAX_TABLE_BYTES, naming the forest with the largest split
 * table. Expects depths already checked (integers in [1, 16]). The estimate is
 * an upper bound: forests read through virtual slots need no bitsets.
 *
 * @example
 * checkTableSize(model.forests, model.contract, model.heads.length); // [] for any model that fits in 1 GiB
 */
export function checkTableSize(
  forests: readonly ForestModel[],
  contract: FeatureContract,
  headCount: number,
  path = "/forests",
): ScorerIssue[] {
  const numericCount = contract.numeric.length;
  let total = 0;
  let largest = -1;
  let largestBytes = 0;
  let leafCount = 0;
  forests.forEach((forest, f) => {
    const nodes = (1 << forest.depth) - 1;
    let categoricalNodes = 0;
    let maxValues = 0;
    for (const tree of forest.trees) {
      const length = Math.min(nodes, tree.feature.length);
      for (let n = 0; n < length; n++) {
        const c = tree.feature[n] - numericCount;
        const feature = contract.categorical[c];
        if (c >= 0 && feature !== undefined) {
          categoricalNodes++;
          if (feature.values.length > maxValues) maxValues = feature.values.length;
        }
      }
    }
    // The bitset kernel's region: words covering code + 1 for every code (see compileForest).
    let codeMask = 0;
    while (codeMask < maxValues) codeMask = codeMask * 2 + 1;
    const bytes = categoricalNodes === 0 ? 0 : 4 * ((codeMask >>> 5) + 1) * (categoricalNodes + 1);
    if (bytes > largestBytes) {
      largestBytes = bytes;
      largest = f;
    }
    total += bytes;
    leafCount += forest.trees.length * (nodes + 1);
  });
  // The heads' leaf table: [leaf][lane] doubles, lanes as compileHeads rounds them.
  const lanes =
    headCount === 0
      ? 0
      : headCount <= 8
        ? Math.max(2, 2 * Math.ceil(headCount / 2))
        : 8 * Math.ceil(headCount / 8);
  total += 8 * leafCount * lanes;
  if (total <= MAX_TABLE_BYTES) return [];
  const mib = (bytes: number): string => `${Math.ceil(bytes / 2 ** 20)} MiB`;
  const where = largest >= 0 && largestBytes >= total / 2 ? `${path}/${largest}` : path;
  const what =
    largestBytes >= total / 2
      ? `${mib(largestBytes)} for the categorical split tables of this forest (${mib(total)} in all)`
      : `${mib(total)} for the heads' leaf weights and the split tables`;
  return [
    {
      code: "too_large",
      path: where,
      message: `expected compiled tables of at most ${mib(MAX_TABLE_BYTES)}, found a model needing ${what}`,
    },
  ];
}
