import type { InputPlan } from "./compile-inputs.js";

/**
 * Fills the virtual slots (see VirtualSlots) of rows [first, first + count) of a
 * row block made by allocateRowBlock, from their categorical codes, which must
 * already be in place: per feature, the table row of the code (1 where the value
 * goes right, else 0) is copied into the feature's run of slots. The table sits
 * at the end of the block, so the copy is a native copyWithin. Allocates nothing.
 *
 * @example
 * fillVirtualSlots(plan, codes, block, 0, rows);
 */
export function fillVirtualSlots(
  plan: InputPlan,
  codes: Int32Array,
  block: Float64Array,
  first: number,
  count: number,
): void {
  const groupCodeSlot = plan.virtualGroupCodeSlot;
  const groupEnd = plan.virtualGroupEnd;
  const groupTable = plan.virtualGroupTable;
  const groups = groupCodeSlot.length;
  if (groups === 0) return;
  const tableBase = block.length - plan.virtualTable.length;
  const base = 2 * plan.featureCount;
  const stride = plan.stride;
  for (let i = first; i < first + count; i++) {
    const r = i * stride;
    let v = 0;
    for (let g = 0; g < groups; g++) {
      const end = groupEnd[g];
      const width = end - v;
      const from = tableBase + groupTable[g] + codes[r + groupCodeSlot[g]] * width;
      block.copyWithin(r + base + v, from, from + width);
      v = end;
    }
  }
}
