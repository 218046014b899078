import type { EncodingSpec, ForestModel } from "./model-types.js";

/** Where each region of the heads' encoded index space starts. */
export interface EncodedLayout {
  /** Per forest: the encoded index of its first tree's leaf 0. */
  readonly leafOffset: readonly number[];
  /** All trees of all forests. */
  readonly treeCount: number;
  /** Leaf slots of all forests (each tree takes 2^depth). */
  readonly leafCount: number;
  readonly hashedOffset: number;
  /** 2^hashBits. */
  readonly hashedCount: number;
  readonly numericOffset: number;
  /** One past the last encoded index. */
  readonly width: number;
}

/**
 * The encoded index layout [leaves of every tree of every forest][2^hashBits
 * hashed buckets][standardized numerics], the one the heads' weights index.
 *
 * @example
 * const layout = encodedLayout(forests, spec); // 1 forest of 100 trees, depth 6, hashBits 20
 * layout.hashedOffset; // 6400
 * layout.width; // 6400 + 1048576 + spec.numeric.length
 */
export function encodedLayout(
  forests: readonly Pick<ForestModel, "depth" | "trees">[],
  encoding: Pick<EncodingSpec, "hashBits" | "numeric">,
): EncodedLayout {
  const leafOffset: number[] = [];
  let leafCount = 0;
  let treeCount = 0;
  for (const forest of forests) {
    leafOffset.push(leafCount);
    leafCount += forest.trees.length * (1 << forest.depth); // shifts keep small integers (see compileForest)
    treeCount += forest.trees.length;
  }
  const hashedCount = 1 << encoding.hashBits;
  return {
    leafOffset,
    treeCount,
    leafCount,
    hashedOffset: leafCount,
    hashedCount,
    numericOffset: leafCount + hashedCount,
    width: leafCount + hashedCount + encoding.numeric.length,
  };
}
