import type { InputPlan } from "./compile-inputs.js";
import { fillVirtualSlots } from "./fill-virtual-slots.js";
import type { ForestColumns, ForestRows } from "./forest-input.js";

/**
 * Fills rows [start, start + count) of contract-coded input into rows 0.. of the
 * row blocks (see InputPlan); a categorical code that is not a known value's
 * position reads as missing. Allocates nothing.
 *
 * @example
 * fillForestInput(plan, valueCounts, input, 0, 256, block, codes);
 */
export function fillForestInput(
  plan: InputPlan,
  valueCount: Int32Array,
  input: ForestColumns | ForestRows,
  start: number,
  count: number,
  block: Float64Array,
  codes: Int32Array,
): void {
  const F = plan.featureCount;
  const stride = plan.stride;
  const numericCount = plan.numericNames.length;
  for (let f = 0; f < F; f++) {
    const isNumeric = f < numericCount;
    const c = f - numericCount;
    const limit = isNumeric ? 0 : valueCount[c];
    const oneHot = !isNumeric && plan.oneHot[c] === 1;
    // Row-major input is read with stride F from row `start`; a column with stride 1.
    let source: Float64Array | Int32Array;
    let at: number;
    let step: number;
    if ("values" in input) {
      source = input.values;
      at = start * F + f;
      step = F;
    } else {
      source = isNumeric ? input.numeric[f] : input.categorical[c];
      at = start;
      step = 1;
    }
    for (let i = 0, r = f; i < count; i++, r += stride, at += step) {
      const v = source[at];
      if (isNumeric) {
        block[r] = v === v ? v : -Infinity;
        block[r + F] = v === v ? v : Infinity;
      } else {
        const code = v >= 0 && v < limit && v === Math.floor(v) ? v : -1;
        codes[r] = oneHot ? 1 << (code + 1) : 0;
        codes[r + F] = code + 1;
      }
    }
  }
  fillVirtualSlots(plan, codes, block, 0, count);
}
