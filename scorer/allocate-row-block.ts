import type { InputPlan } from "./compile-inputs.js";

/**
 * The number block for `rows` rows of the plan's stride (see InputPlan).
 *
 * @example
 * const block = allocateRowBlock(plan, 256); // rows 0..255
 */
export function allocateRowBlock(plan: InputPlan, rows: number): Float64Array {
  return new Float64Array(rows * plan.stride);
}
