import type { FeatureContract, ForestModel, TreeModel } from "../../scorer/model-types.js";
import { checkJsonSchema } from "../../scorer/json-schema-check.js";
import { LeafcastError, type Issue } from "../errors.js";
import type { TreeSettings } from "../schema/load-training-config.js";
import { parseJsonFile } from "../schema/parse-json-file.js";
import type { FeatureImportance } from "./feature-importance.js";
import type { ForestFile, ForestRecord } from "./forest-file.js";
import { forestFileSchema } from "./forest-file-schema.js";

interface TreeDocument {
  feature: number[];
  threshold: number[];
  missingRight: number[];
  rightCategories: (number[] | null)[];
  leafValue: number[];
}

interface ForestDocument {
  outcome: string;
  baseLogit: number;
  depth: number;
  treesFitted: number;
  startTrainLoss: number;
  startValidationLoss: number | null;
  trainLoss: number[];
  validationLoss: number[] | null;
  importance: FeatureImportance[];
  trees: TreeDocument[];
}

interface ForestFileDocument {
  seed: number;
  settings: TreeSettings;
  features: FeatureContract;
  binEdges: { feature: string; edges: number[] }[];
  forests: ForestDocument[];
}

/**
 * Loads a forest file written by writeForestFile and checks it: the structure
 * (forest-file-schema.ts), then what the structure cannot say (node arrays of
 * 2^depth - 1 entries, feature indexes inside the contract, category codes
 * inside their feature's values, ascending bin edges). Every problem is
 * reported at once in a LeafcastError from "forests".
 *
 * @example
 * const file = await readForestFile("runs/demo/forests.json");
 * file.forests[0].forest.trees.length;
 */
export async function readForestFile(path: string): Promise<ForestFile> {
  return parseForestFile(await parseJsonFile(path, "forests"), path);
}

/** Checks a parsed forest-file document and builds the ForestFile; `file` labels errors. */
export function parseForestFile(document: unknown, file = "<forests>"): ForestFile {
  const issues: Issue[] = checkJsonSchema(forestFileSchema, document).map((issue) => ({
    code: issue.code,
    message: `${issue.path || "/"}: ${issue.message}`,
    file,
  }));
  if (issues.length > 0) throw new LeafcastError("forests", issues);
  const doc = document as ForestFileDocument;
  const problem = (code: string, path: string, message: string): void => {
    issues.push({ code, message: `${path}: ${message}`, file });
  };
  const contract = doc.features;
  const numericCount = contract.numeric.length;
  const names = [...contract.numeric, ...contract.categorical.map((c) => c.name)];
  if (new Set(names).size !== names.length) {
    problem(
      "duplicate_feature",
      "/features",
      "expected distinct feature names, found a name twice",
    );
  }
  const binEdges = new Map<string, Float64Array>();
  doc.binEdges.forEach(({ feature, edges }, i) => {
    if (!contract.numeric.includes(feature) || binEdges.has(feature)) {
      problem(
        "unknown_feature",
        `/binEdges/${i}`,
        `expected a numeric feature listed once, found "${feature}"`,
      );
    }
    if (edges.some((e, k) => k > 0 && !(e > edges[k - 1]))) {
      problem("bad_edges", `/binEdges/${i}`, "expected strictly ascending edges");
    }
    binEdges.set(feature, Float64Array.from(edges));
  });
  const forests = doc.forests.map((forest, f): ForestRecord => {
    const at = `/forests/${f}`;
    const internal = 2 ** forest.depth - 1;
    if (forest.trainLoss.length !== forest.treesFitted) {
      problem(
        "bad_length",
        `${at}/trainLoss`,
        `expected ${forest.treesFitted} losses, found ${forest.trainLoss.length}`,
      );
    }
    if (forest.validationLoss !== null && forest.validationLoss.length !== forest.treesFitted) {
      problem(
        "bad_length",
        `${at}/validationLoss`,
        `expected ${forest.treesFitted} losses, found ${forest.validationLoss.length}`,
      );
    }
    if (forest.trees.length > forest.treesFitted) {
      problem(
        "bad_length",
        `${at}/trees`,
        `expected at most ${forest.treesFitted} trees, found ${forest.trees.length}`,
      );
    }
    if (forest.importance.map((i) => i.feature).join("\u0000") !== names.join("\u0000")) {
      problem(
        "bad_importance",
        `${at}/importance`,
        "expected one entry per feature, in contract order",
      );
    }
    const trees = forest.trees.map((tree, t): TreeModel => {
      const where = `${at}/trees/${t}`;
      for (const key of ["feature", "threshold", "missingRight", "rightCategories"] as const) {
        if (tree[key].length !== internal) {
          problem(
            "bad_length",
            `${where}/${key}`,
            `expected ${internal} entries (depth ${forest.depth}), found ${tree[key].length}`,
          );
        }
      }
      if (tree.leafValue.length !== internal + 1) {
        problem(
          "bad_length",
          `${where}/leafValue`,
          `expected ${internal + 1} entries, found ${tree.leafValue.length}`,
        );
      }
      tree.feature.forEach((feature, i) => {
        const codes = tree.rightCategories[i] ?? null;
        if (feature >= names.length) {
          problem(
            "bad_feature",
            `${where}/feature/${i}`,
            `expected a feature index below ${names.length}, found ${feature}`,
          );
        } else if (feature >= numericCount) {
          const values = contract.categorical[feature - numericCount].values.length;
          if (codes === null) {
            problem(
              "bad_categories",
              `${where}/rightCategories/${i}`,
              "expected the codes of a categorical split, found null",
            );
          } else if (codes.some((code, k) => code >= values || (k > 0 && code <= codes[k - 1]))) {
            problem(
              "bad_categories",
              `${where}/rightCategories/${i}`,
              `expected ascending codes below ${values}`,
            );
          }
        } else if (codes !== null) {
          problem(
            "bad_categories",
            `${where}/rightCategories/${i}`,
            "expected null for a numeric or pass-through node",
          );
        }
      });
      return {
        feature: Int32Array.from(tree.feature),
        threshold: Float64Array.from(tree.threshold),
        missingRight: Uint8Array.from(tree.missingRight),
        rightCategories: tree.rightCategories.map((codes) =>
          codes === null ? null : Int32Array.from(codes),
        ),
        leafValue: Float64Array.from(tree.leafValue),
      };
    });
    const model: ForestModel = {
      outcome: forest.outcome,
      baseLogit: forest.baseLogit,
      depth: forest.depth,
      trees,
    };
    return {
      forest: model,
      trainLoss: Float64Array.from(forest.trainLoss),
      validationLoss:
        forest.validationLoss === null ? null : Float64Array.from(forest.validationLoss),
      startTrainLoss: forest.startTrainLoss,
      startValidationLoss: forest.startValidationLoss,
      treesFitted: forest.treesFitted,
      importance: forest.importance,
    };
  });
  if (issues.length > 0) throw new LeafcastError("forests", issues);
  return { seed: doc.seed, settings: doc.settings, contract, binEdges, forests };
}
