import { checkForestModel } from "./check-forest-model.js";
import { checkTableSize } from "./check-table-size.js";
import { encodedLayout } from "./encoded-layout.js";
import type { HeadModel, ScoringModel } from "./model-types.js";
import type { ScorerIssue } from "./scorer-error.js";
import { STANDARDIZED_LIMIT } from "./clip-standardized.js";

const MAX_ISSUES = 50;

/**
 * The semantic checks a model must pass before it is compiled for scoring: names
 * unique and resolvable, array lengths matching the depth, feature, category,
 * leaf and head indexes in range, head indexes ascending, every number finite
 * and no sum of them able to overflow (a head's bias and weights, the value
 * weights), compiled tables of bounded size (see checkTableSize).
 * Paths are the JSON Pointers of the same values in an artifact, so a refusal
 * names the exact entry of the file.
 *
 * @example
 * const issues = checkScoringModel(model);
 * // [{ code: "out_of_range", path: "/forests/0/feature/17", message: "expected a feature index in [-1, 12), found 40" }]
 */
export function checkScoringModel(model: ScoringModel): ScorerIssue[] {
  const issues: ScorerIssue[] = [];
  const add = (code: string, path: string, message: string): void => {
    if (issues.length < MAX_ISSUES) issues.push({ code, path, message });
  };
  const { contract, encoding } = model;
  const kinds = new Map<string, "numeric" | "categorical">();
  contract.numeric.forEach((name, i) => {
    if (kinds.has(name))
      add("duplicate", `/contract/numeric/${i}`, `feature "${name}" appears twice`);
    kinds.set(name, "numeric");
  });
  contract.categorical.forEach((feature, j) => {
    const path = `/contract/categorical/${j}`;
    if (kinds.has(feature.name))
      add("duplicate", `${path}/name`, `feature "${feature.name}" appears twice`);
    kinds.set(feature.name, "categorical");
    const seen = new Set<string>();
    feature.values.forEach((value, k) => {
      if (seen.has(value))
        add("duplicate", `${path}/values/${k}`, `value "${value}" appears twice`);
      seen.add(value);
    });
  });
  if (!Number.isInteger(encoding.hashBits) || encoding.hashBits < 1 || encoding.hashBits > 28) {
    add(
      "out_of_range",
      "/contract/hashing/bits",
      `expected an integer in [1, 28], found ${encoding.hashBits}`,
    );
  }
  if (
    !Number.isInteger(encoding.hashSeed) ||
    encoding.hashSeed < 0 ||
    encoding.hashSeed > 0xffffffff
  ) {
    add(
      "out_of_range",
      "/contract/hashing/seed",
      `expected an integer in [0, 4294967295], found ${encoding.hashSeed}`,
    );
  }
  const expectKind = (name: string, kind: string, path: string): void => {
    const found = kinds.get(name);
    if (found !== kind) {
      const what = found === undefined ? "no such feature" : `a ${found} feature`;
      add(
        "unknown_feature",
        path,
        `expected "${name}" to be a ${kind} feature of the contract, found ${what}`,
      );
    }
  };
  encoding.hashed.forEach((name, i) =>
    expectKind(name, "categorical", `/contract/hashing/columns/${i}`),
  );
  encoding.crosses.forEach((cross, i) => {
    if (cross.length < 2 || cross.length > 4) {
      add(
        "cross_size",
        `/contract/hashing/crosses/${i}`,
        `expected 2 to 4 features, found ${cross.length}`,
      );
    }
    cross.forEach((name, k) =>
      expectKind(name, "categorical", `/contract/hashing/crosses/${i}/${k}`),
    );
  });
  encoding.numeric.forEach((entry, j) => {
    const path = `/contract/standardized/${j}`;
    expectKind(entry.name, "numeric", `${path}/feature`);
    if (!Number.isFinite(entry.mean))
      add("not_finite", `${path}/mean`, `expected a finite number, found ${entry.mean}`);
    if (!(Number.isFinite(entry.std) && entry.std > 0)) {
      add("out_of_range", `${path}/std`, `expected a finite number > 0, found ${entry.std}`);
    }
  });
  const forestOutcomes = new Set<string>();
  model.forests.forEach((forest, f) => {
    if (forestOutcomes.has(forest.outcome)) {
      add("duplicate", `/forests/${f}/outcome`, `outcome "${forest.outcome}" has two forests`);
    }
    forestOutcomes.add(forest.outcome);
    for (const issue of checkForestModel(forest, model.contract, `/forests/${f}`))
      add(issue.code, issue.path, issue.message);
  });
  const layoutOk =
    Number.isInteger(encoding.hashBits) &&
    encoding.hashBits >= 1 &&
    encoding.hashBits <= 28 &&
    model.forests.every(
      (forest) => Number.isInteger(forest.depth) && forest.depth >= 1 && forest.depth <= 16,
    );
  const layout = layoutOk ? encodedLayout(model.forests, encoding) : null;
  const width = layout === null ? Infinity : layout.width;
  // How often a weight can enter one logit: a hashed bucket once per hashed
  // feature and cross (two can share a bucket), a numeric weight times an input
  // clipped to STANDARDIZED_LIMIT.
  const reach: WeightReach = {
    hashedOffset: layout === null ? Infinity : layout.hashedOffset,
    numericOffset: layout === null ? Infinity : layout.numericOffset,
    hashedTimes: Math.max(1, encoding.hashed.length + encoding.crosses.length),
  };
  // Each forest alone was measured by checkForestModel; here all of them with the heads' leaf table.
  if (layoutOk && !issues.some((issue) => issue.code === "too_large")) {
    for (const issue of checkTableSize(model.forests, contract, model.heads.length))
      add(issue.code, issue.path, issue.message);
  }
  const headOutcomes = new Set<string>();
  model.heads.forEach((head, h) => {
    if (headOutcomes.has(head.outcome))
      add("duplicate", `/heads/${h}/outcome`, `outcome "${head.outcome}" has two heads`);
    headOutcomes.add(head.outcome);
    checkHead(head, h, width, reach, add);
  });
  if (model.valueWeights.length !== model.heads.length) {
    add(
      "length",
      "/heads",
      `expected a value weight per head (${model.heads.length}), found ${model.valueWeights.length}`,
    );
  }
  let valueSum = 0;
  model.valueWeights.forEach((w, h) => {
    valueSum += Math.abs(w);
    if (!Number.isFinite(w))
      add("not_finite", `/heads/${h}/valueWeight`, `expected a finite number, found ${w}`);
  });
  // The combined score sums valueWeight x q with q up to 1: two weights of 1e308 overflow.
  if (valueSum === Infinity && model.valueWeights.every(Number.isFinite)) {
    add(
      "overflow",
      "/heads",
      "expected value weights whose absolute sum is a finite double, found one that overflows",
    );
  }
  return issues;
}

type Add = (code: string, path: string, message: string) => void;

/** Where the encoded regions start, and how often a hashed weight can count. */
interface WeightReach {
  readonly hashedOffset: number;
  readonly numericOffset: number;
  readonly hashedTimes: number;
}

function checkHead(head: HeadModel, h: number, width: number, reach: WeightReach, add: Add): void {
  const base = `/heads/${h}`;
  if (!Number.isFinite(head.bias))
    add("not_finite", `${base}/bias`, `expected a finite number, found ${head.bias}`);
  const rate = head.negativeKeepRate;
  if (!(rate > 0 && rate <= 1))
    add("out_of_range", `${base}/negativeKeepRate`, `expected a number in (0, 1], found ${rate}`);
  if (head.index.length !== head.weight.length) {
    add(
      "length",
      `${base}/weight`,
      `expected one weight per index (${head.index.length}), found ${head.weight.length}`,
    );
    return;
  }
  let previous = -1;
  // A logit adds the bias and some of the weights, each at most `times` over: this sum bounds it.
  let sum = Math.abs(head.bias);
  let allFinite = Number.isFinite(head.bias);
  for (let i = 0; i < head.index.length; i++) {
    const index = head.index[i];
    if (!(index >= 0 && index < width)) {
      add(
        "out_of_range",
        `${base}/indexDelta/${i}`,
        `expected an encoded index in [0, ${width}), found ${index}`,
      );
      return;
    }
    if (index <= previous) {
      add(
        "not_ascending",
        `${base}/indexDelta/${i}`,
        `expected indexes strictly ascending, found ${index} after ${previous}`,
      );
      return;
    }
    previous = index;
    const times =
      index >= reach.numericOffset
        ? STANDARDIZED_LIMIT
        : index >= reach.hashedOffset
          ? reach.hashedTimes
          : 1;
    sum += Math.abs(head.weight[i]) * times;
    if (!Number.isFinite(head.weight[i])) {
      allFinite = false;
      add("not_finite", `${base}/weight/${i}`, `expected a finite number, found ${head.weight[i]}`);
    }
  }
  if (allFinite && sum === Infinity) {
    add(
      "overflow",
      `${base}/weight`,
      "expected a bias and weights whose logit cannot overflow (absolute sum, hashed weights once per hashed feature, numeric weights times the clipped input), found one that can",
    );
  }
}
