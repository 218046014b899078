import type { BoundBatch } from "./column-binder.js";
import type { InputPlan } from "./compile-inputs.js";
import { murmur3Parts } from "./murmur3.js";

/** Marks a cache entry not computed yet (tree codes and buckets are -1 or more). */
export const NOT_YET = -2;

/**
 * Writes rows [start, start + count) of a bound batch's hashed features into rows
 * 0.. of the hashed-slot block: per single feature and per cross, the encoded
 * index of its bucket, or -1 when a value is missing. Buckets come from the
 * binder's per-code and per-pair caches, hashing only what is new. Allocates
 * nothing.
 *
 * @example
 * fillHashedSlots(plan, bound, 0, 256, hashedSlots, parts);
 */
export function fillHashedSlots(
  plan: InputPlan,
  bound: BoundBatch,
  start: number,
  count: number,
  hashedSlots: Int32Array,
  parts: string[],
): void {
  const K = plan.hashedSlotCount;
  const singles = plan.hashedFeature.length;
  for (let k = 0; k < singles; k++) {
    const c = plan.hashedFeature[k];
    const codes = bound.codes[c];
    const texts = bound.texts[c];
    const bucket = bound.bucket[c];
    for (let i = 0; i < count; i++) {
      const code = codes[start + i];
      let slot = -1;
      if (code >= 0) {
        slot = bucket[code];
        if (slot === NOT_YET) {
          parts[0] = plan.hashedPrefix[k];
          parts[1] = texts[code];
          slot = bucket[code] =
            plan.hashedOffset + (murmur3Parts(parts, 2, plan.hashSeed) & plan.hashMask);
        }
      }
      hashedSlots[i * K + k] = slot;
    }
  }
  for (let x = 0; x < plan.crossFeatures.length; x++) {
    const features = plan.crossFeatures[x];
    const prefixes = plan.crossPrefixes[x];
    const table = bound.crossBucket[x];
    if (table !== null) {
      const [a, b] = [features[0], features[1]];
      const codesA = bound.codes[a];
      const codesB = bound.codes[b];
      const sizeB = bound.texts[b].length;
      for (let i = 0; i < count; i++) {
        const codeA = codesA[start + i];
        const codeB = codesB[start + i];
        let slot = -1;
        if (codeA >= 0 && codeB >= 0) {
          slot = table[codeA * sizeB + codeB];
          if (slot === NOT_YET) {
            parts[0] = prefixes[0];
            parts[1] = bound.texts[a][codeA];
            parts[2] = prefixes[1];
            parts[3] = bound.texts[b][codeB];
            slot = table[codeA * sizeB + codeB] =
              plan.hashedOffset + (murmur3Parts(parts, 4, plan.hashSeed) & plan.hashMask);
          }
        }
        hashedSlots[i * K + singles + x] = slot;
      }
      continue;
    }
    for (let i = 0; i < count; i++) {
      let present = true;
      for (let k = 0; k < features.length && present; k++) {
        const c = features[k];
        const code = bound.codes[c][start + i];
        present = code >= 0;
        parts[2 * k] = prefixes[k];
        parts[2 * k + 1] = present ? bound.texts[c][code] : "";
      }
      hashedSlots[i * K + singles + x] = present
        ? plan.hashedOffset +
          (murmur3Parts(parts, 2 * features.length, plan.hashSeed) & plan.hashMask)
        : -1;
    }
  }
}
