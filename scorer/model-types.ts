/**
 * The in-memory model that the trainer produces and the scorer applies. The
 * artifact (schemas/scorer-artifact.schema.json) is a compact serialization of
 * these; the scorer's traversal over them is the one the trainer's leaf encoder
 * calls, so training and serving compute the same thing by construction.
 */

/**
 * The inputs a model reads, in a fixed order. Numeric features come first
 * (index i), categorical features after them (index numeric.length + j).
 */
export interface FeatureContract {
  readonly numeric: readonly string[];
  readonly categorical: readonly CategoricalFeature[];
}

export interface CategoricalFeature {
  readonly name: string;
  /**
   * The values the trees split on natively, in code order (code = position).
   * Empty for a categorical feature used only by the heads (hashed). Values not
   * listed are read as missing by the trees.
   */
  readonly values: readonly string[];
}

/**
 * One tree in the implicit complete layout: internal node i has children
 * 2i + 1 (left) and 2i + 2 (right); a tree that stopped growing early is padded
 * with pass-through nodes so that every tree of a forest has the same depth.
 * Leaf k (0 <= k < 2^depth) is node 2^depth - 1 + k.
 */
export interface TreeModel {
  /** Per internal node (2^depth - 1): feature index in the contract, or -1 for a pass-through node that always goes left. */
  readonly feature: Int32Array;
  /** Per internal node: a numeric split goes right when x > threshold (a raw feature value). */
  readonly threshold: Float64Array;
  /** Per internal node: 1 when a missing value goes right, else 0. */
  readonly missingRight: Uint8Array;
  /**
   * Per internal node: for a categorical split, the category codes that go right
   * (sorted); null for numeric and pass-through nodes.
   */
  readonly rightCategories: readonly (Int32Array | null)[];
  /** Per leaf (2^depth): the leaf value, learning rate already applied. */
  readonly leafValue: Float64Array;
}

/** The trees fitted for one outcome; their leaves are features for every head. */
export interface ForestModel {
  readonly outcome: string;
  /** The forest's starting log-odds (logit of the weighted positive rate). */
  readonly baseLogit: number;
  readonly depth: number;
  readonly trees: readonly TreeModel[];
}

/**
 * A logistic head for one outcome: sparse weights over the encoded features
 * (leaf one-hots of every forest, hashed categoricals, standardized numerics).
 */
export interface HeadModel {
  readonly outcome: string;
  readonly bias: number;
  /** Encoded-feature indexes with a non-zero weight, ascending. */
  readonly index: Int32Array;
  readonly weight: Float64Array;
  /**
   * Negative keep rate the head was trained with under "recalibrate" correction:
   * the served probability is q = p / (p + (1 - p) / rate). 1 means no correction.
   */
  readonly negativeKeepRate: number;
}

/**
 * How a row becomes the heads' sparse input. The encoded index space is laid out as
 * [leaf one-hots of every tree of every forest, in forest then tree order, 2^depth
 * slots per tree] then [2^hashBits hashed buckets] then [one slot per standardized
 * numeric feature]. The bias is kept apart from the index space (HeadModel.bias).
 */
export interface EncodingSpec {
  readonly hashBits: number;
  readonly hashSeed: number;
  /** Categorical columns hashed one by one. */
  readonly hashed: readonly string[];
  /** Crosses of categorical columns, each hashed as one feature. */
  readonly crosses: readonly (readonly string[])[];
  /** Numeric features added standardized: (x - mean) / std, missing -> 0. */
  readonly numeric: readonly {
    readonly name: string;
    readonly mean: number;
    readonly std: number;
  }[];
}

/**
 * A batch of encoded rows in compressed sparse row form: row r's entries are
 * index[offsets[r] .. offsets[r + 1]). value is null when every entry is 1
 * (leaves and hashed buckets); otherwise it holds one value per entry.
 */
export interface EncodedBatch {
  readonly rowCount: number;
  readonly offsets: Uint32Array;
  readonly index: Int32Array;
  readonly value: Float64Array | null;
}

/**
 * Everything the scorer needs: the trees, how rows are encoded for the heads, the
 * heads, and each head's weight in the combined ranking score. The artifact is a
 * serialization of exactly this.
 */
export interface ScoringModel {
  readonly contract: FeatureContract;
  readonly forests: readonly ForestModel[];
  readonly encoding: EncodingSpec;
  readonly heads: readonly HeadModel[];
  /** Per head, in the same order: the outcome's weight in the combined score sum(valueWeight * q). */
  readonly valueWeights: readonly number[];
}
