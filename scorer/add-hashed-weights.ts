import type { CompiledHeads } from "./compile-heads.js";

/**
 * Adds the heads' weights of each row's hashed buckets to z (see sumLeafWeights
 * for the z layout). `hashedSlots[i * slotCount + k]` is an encoded index in the
 * hashed region, or -1 for a missing value; buckets no head weighs are skipped.
 *
 * @example
 * addHashedWeights(hashedSlots, plan.hashedSlotCount, rows, layout.hashedOffset, heads, z);
 */
export function addHashedWeights(
  hashedSlots: Int32Array,
  slotCount: number,
  count: number,
  hashedOffset: number,
  heads: CompiledHeads,
  z: Float64Array,
): void {
  const keys = heads.bucketKey;
  const rows = heads.bucketRow;
  const weight = heads.hashedWeight;
  const lanes = heads.lanes;
  const headCount = heads.headCount;
  const tableMask = keys.length - 1;
  for (let i = 0; i < count; i++) {
    const zo = i * lanes;
    for (let k = 0; k < slotCount; k++) {
      const slot = hashedSlots[i * slotCount + k];
      if (slot < 0) continue;
      const bucket = slot - hashedOffset;
      let at = bucket & tableMask;
      let key = keys[at];
      while (key !== bucket && key !== -1) {
        at = (at + 1) & tableMask;
        key = keys[at];
      }
      if (key === -1) continue;
      const g = rows[at] * lanes;
      for (let h = 0; h < headCount; h++) z[zo + h] += weight[g + h];
    }
  }
}
