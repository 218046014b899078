import { writeFileAtomic } from "../io/write-file-atomic.js";
import { FOREST_FILE_FORMAT, FOREST_FILE_VERSION, type ForestFile } from "./forest-file.js";

/**
 * Saves forests as JSON (format "leafcast-forests", version 1), atomically: a
 * reader sees the old file or the whole new one. Typed arrays become plain
 * arrays; every number in the file is finite (bin edges end at
 * Number.MAX_VALUE), so the file is strict JSON. readForestFile loads it back.
 *
 * @example
 * await writeForestFile("runs/demo/forests.json", forestFileOf(binned, fitted, config.trees, config.seed));
 */
export async function writeForestFile(path: string, file: ForestFile): Promise<void> {
  const document = {
    format: FOREST_FILE_FORMAT,
    version: FOREST_FILE_VERSION,
    seed: file.seed,
    settings: file.settings,
    features: file.contract,
    binEdges: [...file.binEdges].map(([feature, edges]) => ({ feature, edges: Array.from(edges) })),
    forests: file.forests.map((record) => ({
      outcome: record.forest.outcome,
      baseLogit: record.forest.baseLogit,
      depth: record.forest.depth,
      treesFitted: record.treesFitted,
      startTrainLoss: record.startTrainLoss,
      startValidationLoss: record.startValidationLoss,
      trainLoss: Array.from(record.trainLoss),
      validationLoss: record.validationLoss === null ? null : Array.from(record.validationLoss),
      importance: record.importance,
      trees: record.forest.trees.map((tree) => ({
        feature: Array.from(tree.feature),
        threshold: Array.from(tree.threshold),
        missingRight: Array.from(tree.missingRight),
        rightCategories: tree.rightCategories.map((codes) =>
          codes === null ? null : Array.from(codes),
        ),
        leafValue: Array.from(tree.leafValue),
      })),
    })),
  };
  await writeFileAtomic(path, `${JSON.stringify(document)}\n`);
}
