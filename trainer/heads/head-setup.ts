import type { EncodedBatch, EncodingSpec } from "../../scorer/model-types.js";
import type { HeadSettings } from "../schema/load-training-config.js";

/**
 * Everything a head state is bound to. A saved state resumes only under an equal
 * setup (see check-resume.ts): other trees, another schema or another index space
 * would give its coordinates another meaning.
 *
 * @example
 * const setup: HeadSetup = {
 *   outcomes: ["open", "reply"], settings: config.heads, encoding, indexSize,
 *   seed: config.seed, treesFingerprint: fingerprintForests(forests),
 *   schemaFingerprint: fingerprintSchema(schema),
 * };
 */
export interface HeadSetup {
  /** One head per outcome, in this order (the order of HeadBatch.labels). */
  readonly outcomes: readonly string[];
  /** FTRL and downsampling settings; its encoding fields are read from `encoding` instead. */
  readonly settings: HeadSettings;
  /** How rows were encoded; stored with the state so serving encodes the same way. */
  readonly encoding: EncodingSpec;
  /** Size of the encoded index space (leaf slots + 2^hashBits + numeric slots). */
  readonly indexSize: number;
  /** Seed of the negative-downsampling draws. */
  readonly seed: number;
  readonly treesFingerprint: string;
  readonly schemaFingerprint: string;
}

/**
 * One batch of training rows for the heads: encoded features plus, per head,
 * the 0/1 labels, and optional sample weights and timestamps.
 *
 * @example
 * const batch: HeadBatch = { encoded, labels: [openLabels, replyLabels], weights: null, timestamps };
 */
export interface HeadBatch {
  readonly encoded: EncodedBatch;
  /** Per head in HeadSetup.outcomes order: one 0/1 label per row. */
  readonly labels: readonly Uint8Array[];
  /** Per row sample weight (finite, >= 0), or null for weight 1. */
  readonly weights: Float64Array | null;
  /** Per row milliseconds since the Unix epoch, or null when the data has no time column. */
  readonly timestamps: Float64Array | null;
}
