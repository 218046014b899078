import type { InputPlan } from "./compile-inputs.js";
import { fillVirtualSlots } from "./fill-virtual-slots.js";
import { murmur3Parts } from "./murmur3.js";
import type { ScoreItem } from "./score-item.js";
import { ScorerError } from "./scorer-error.js";

/** Scratch space for reading items, owned by one scorer. */
export interface ItemScratch {
  /** Per categorical feature: the item's text, or null when missing. */
  readonly texts: (string | null)[];
  /** Key pieces for murmur3Parts: at most 2 per cross feature. */
  readonly parts: string[];
}

/**
 * Reads one item into row `row` of the row blocks and of the hashed-slot block
 * (encoded index per hashed feature, -1 when missing); see InputPlan for the
 * block layout. Throws a ScorerError naming the feature when a value has the
 * wrong type.
 *
 * @example
 * fillItem(plan, { tie_strength: 0.4, crop: "kale" }, block, codes, hashedSlots, 0, scratch);
 */
export function fillItem(
  plan: InputPlan,
  item: ScoreItem,
  block: Float64Array,
  codes: Int32Array,
  hashedSlots: Int32Array,
  row: number,
  scratch: ItemScratch,
  withHashing = true,
): void {
  if (typeof item !== "object" || item === null) {
    const found = item === null ? "null" : typeof item;
    throw new ScorerError("item", [
      {
        code: "not_an_object",
        path: "",
        message: `expected an object of feature values, found ${found}`,
      },
    ]);
  }
  const F = plan.featureCount;
  const r = row * plan.stride;
  const numericCount = plan.numericNames.length;
  const guarded = plan.guardedName;
  for (let f = 0; f < numericCount; f++) {
    const name = plan.numericNames[f];
    const value = guarded[f] === 1 ? ownValue(item, name) : item[name];
    if (typeof value === "number" && value === value) {
      block[r + f] = value;
      block[r + F + f] = value;
    } else if (value === null || value === undefined || typeof value === "number") {
      block[r + f] = -Infinity;
      block[r + F + f] = Infinity;
    } else {
      throw wrongType(name, "a number or null", value);
    }
  }
  const texts = scratch.texts;
  for (let c = 0; c < plan.categoricalNames.length; c++) {
    const f = numericCount + c;
    const name = plan.categoricalNames[c];
    const value = guarded[f] === 1 ? ownValue(item, name) : item[name];
    let text: string | null;
    if (typeof value === "string") text = value;
    else if (value === null || value === undefined) text = null;
    else if (typeof value === "number" && Number.isFinite(value)) text = String(value);
    else if (typeof value === "number") text = null;
    else throw wrongType(name, "a string or null", value);
    texts[c] = text;
    const code = text === null ? -1 : (plan.codeOf[c].get(text) ?? -1);
    codes[r + f] = plan.oneHot[c] === 1 ? 1 << (code + 1) : 0;
    codes[r + F + f] = code + 1;
  }
  fillVirtualSlots(plan, codes, block, row, 1);
  if (!withHashing) return;
  const parts = scratch.parts;
  const K = plan.hashedSlotCount;
  const s = row * K;
  const singles = plan.hashedFeature.length;
  for (let k = 0; k < singles; k++) {
    const text = texts[plan.hashedFeature[k]];
    if (text === null) {
      hashedSlots[s + k] = -1;
    } else {
      parts[0] = plan.hashedPrefix[k];
      parts[1] = text;
      hashedSlots[s + k] =
        plan.hashedOffset + (murmur3Parts(parts, 2, plan.hashSeed) & plan.hashMask);
    }
  }
  for (let x = 0; x < plan.crossFeatures.length; x++) {
    const features = plan.crossFeatures[x];
    const prefixes = plan.crossPrefixes[x];
    let present = true;
    for (let k = 0; k < features.length && present; k++) {
      const text = texts[features[k]];
      present = text !== null;
      parts[2 * k] = prefixes[k];
      parts[2 * k + 1] = text ?? "";
    }
    hashedSlots[s + singles + x] = present
      ? plan.hashedOffset +
        (murmur3Parts(parts, 2 * features.length, plan.hashSeed) & plan.hashMask)
      : -1;
  }
}

function ownValue(item: ScoreItem, name: string): unknown {
  return Object.prototype.hasOwnProperty.call(item, name) ? item[name] : undefined;
}

function wrongType(name: string, expected: string, value: unknown): ScorerError {
  const found =
    typeof value === "string"
      ? JSON.stringify(value.length > 40 ? `${value.slice(0, 40)}...` : value)
      : typeof value === "object"
        ? Array.isArray(value)
          ? "an array"
          : "an object"
        : `${typeof value} ${String(value)}`;
  return new ScorerError("item", [
    {
      code: "wrong_type",
      path: `/${name}`,
      message: `feature "${name}" expected ${expected}, found ${found}`,
    },
  ]);
}
