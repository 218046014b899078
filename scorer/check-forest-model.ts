import type { FeatureContract, ForestModel } from "./model-types.js";
import type { ScorerIssue } from "./scorer-error.js";
import { checkTableSize } from "./check-table-size.js";

/**
 * The semantic checks of one forest against a contract: depth in [1, 16], array
 * lengths matching the depth, feature indexes in range, finite thresholds and
 * leaf values whose largest sum stays finite, categorical codes ascending and
 * known, split tables of bounded size (see checkTableSize). Paths are the artifact's
 * JSON Pointers under `path` (tree t's node n is entry t * (2^depth - 1) + n).
 *
 * @example
 * checkForestModel(forest, contract); // [] when the forest can be compiled
 */
export function checkForestModel(
  forest: ForestModel,
  contract: FeatureContract,
  path = "/forests/0",
): ScorerIssue[] {
  const issues: ScorerIssue[] = [];
  const add: Add = (code, at, message) => {
    if (issues.length < 50) issues.push({ code, path: at, message });
  };
  checkForest(forest, path, contract, add);
  return issues;
}

type Add = (code: string, path: string, message: string) => void;

function checkForest(forest: ForestModel, base: string, contract: FeatureContract, add: Add): void {
  const { depth } = forest;
  if (!Number.isInteger(depth) || depth < 1 || depth > 16) {
    add("out_of_range", `${base}/depth`, `expected an integer in [1, 16], found ${depth}`);
    return;
  }
  if (!Number.isFinite(forest.baseLogit))
    add("not_finite", `${base}/baseLogit`, `expected a finite number, found ${forest.baseLogit}`);
  const nodes = (1 << depth) - 1;
  const leaves = nodes + 1;
  const numericCount = contract.numeric.length;
  const featureCount = numericCount + contract.categorical.length;
  // The largest raw score a row can reach: each value finite is not enough, since
  // 1e308 in two trees sums to Infinity (and +Infinity - Infinity to NaN).
  let largestSum = Math.abs(forest.baseLogit);
  let allFinite = Number.isFinite(forest.baseLogit);
  forest.trees.forEach((tree, t) => {
    const lengths: [string, number, number][] = [
      ["feature", tree.feature.length, nodes],
      ["threshold", tree.threshold.length, nodes],
      ["missingRight", tree.missingRight.length, nodes],
      ["rightCategories", tree.rightCategories.length, nodes],
      ["leafValue", tree.leafValue.length, leaves],
    ];
    let lengthsOk = true;
    for (const [field, found, expected] of lengths) {
      if (found !== expected) {
        lengthsOk = false;
        add(
          "length",
          `${base}/trees/${t}/${field}`,
          `expected ${expected} entries for depth ${depth}, found ${found}`,
        );
      }
    }
    if (!lengthsOk) return;
    for (let n = 0; n < nodes; n++) {
      const entry = t * nodes + n;
      const feature = tree.feature[n];
      if (!(feature >= -1 && feature < featureCount)) {
        add(
          "out_of_range",
          `${base}/feature/${entry}`,
          `expected a feature index in [-1, ${featureCount}), found ${feature}`,
        );
        continue;
      }
      const mr = tree.missingRight[n];
      if (mr !== 0 && mr !== 1)
        add("out_of_range", `${base}/missingRight/${entry}`, `expected 0 or 1, found ${mr}`);
      const categories = tree.rightCategories[n];
      if (feature >= numericCount) {
        const valueCount = contract.categorical[feature - numericCount].values.length;
        if (categories !== null)
          checkCategories(categories, valueCount, `${base}/categorySplits`, entry, add);
      } else {
        if (feature >= 0 && !Number.isFinite(tree.threshold[n])) {
          add(
            "not_finite",
            `${base}/threshold/${entry}`,
            `expected a finite number, found ${tree.threshold[n]}`,
          );
        }
        if (categories !== null && categories.length > 0) {
          add(
            "categories_at_numeric_node",
            `${base}/categorySplits`,
            `node ${entry}: expected no categories at a numeric or pass-through node`,
          );
        }
      }
    }
    let largestLeaf = 0;
    for (let k = 0; k < leaves; k++) {
      largestLeaf = Math.max(largestLeaf, Math.abs(tree.leafValue[k]));
      if (!Number.isFinite(tree.leafValue[k])) {
        allFinite = false;
        add(
          "not_finite",
          `${base}/leafValue/${t * leaves + k}`,
          `expected a finite number, found ${tree.leafValue[k]}`,
        );
      }
    }
    largestSum += largestLeaf;
  });
  if (allFinite && largestSum === Infinity) {
    add(
      "overflow",
      `${base}/leafValue`,
      "expected leaf values whose largest sum over the trees is a finite double, found one that overflows",
    );
  }
  for (const issue of checkTableSize([forest], contract, 0)) add(issue.code, base, issue.message);
}

function checkCategories(
  codes: Int32Array,
  valueCount: number,
  path: string,
  node: number,
  add: Add,
): void {
  let previous = -1;
  for (let i = 0; i < codes.length; i++) {
    const code = codes[i];
    if (!(code >= 0 && code < valueCount)) {
      add(
        "out_of_range",
        path,
        `node ${node}: expected category codes in [0, ${valueCount}), found ${code}`,
      );
      return;
    }
    if (code <= previous) {
      add(
        "not_ascending",
        path,
        `node ${node}: expected category codes strictly ascending, found ${code} after ${previous}`,
      );
      return;
    }
    previous = code;
  }
}
