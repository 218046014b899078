import type { EncodingSpec } from "../../scorer/model-types.js";
import type { HeadAveraging } from "../schema/load-training-config.js";
import { LeafcastError, type Issue } from "../errors.js";
import type { HeadSetup } from "./head-setup.js";

/** What a head state was learned under; saved with it and compared on resume. */
export interface HeadStateInfo {
  readonly outcomes: readonly string[];
  readonly alpha: number;
  readonly beta: number;
  readonly lambda1: number;
  readonly lambda2: number;
  /** Per head, in outcome order: the share of negatives it trains on (1 keeps all). */
  readonly negativeKeepRate: readonly number[];
  readonly downsampleCorrection: "weight" | "recalibrate";
  readonly sliceHours: number;
  /** How exported weights are averaged; null: the latest weights are exported (and files from before averaging existed). */
  readonly averaging: HeadAveraging | null;
  readonly seed: number;
  readonly encoding: EncodingSpec;
  readonly indexSize: number;
  readonly treesFingerprint: string;
  readonly schemaFingerprint: string;
}

/**
 * Checks a head setup and flattens it into the settings a state keeps; every
 * problem is gathered and thrown once as a LeafcastError from "heads".
 *
 * @example
 * const info = resolveHeadStateInfo(setup);
 * info.negativeKeepRate; // [1, 1, 0.1, ...] per head
 */
export function resolveHeadStateInfo(setup: HeadSetup): HeadStateInfo {
  const issues: Issue[] = [];
  const bad = (code: string, message: string): void => {
    issues.push({ code, message });
  };
  const s = setup.settings;
  if (setup.outcomes.length === 0) bad("no_heads", "expected at least one outcome, found none");
  if (new Set(setup.outcomes).size !== setup.outcomes.length) {
    bad("duplicate_outcome", `expected distinct outcomes, found ${setup.outcomes.join(", ")}`);
  }
  if (!Number.isInteger(setup.indexSize) || setup.indexSize < 0 || setup.indexSize >= 2 ** 31) {
    bad("bad_index_size", `expected an index-space size in [0, 2^31), found ${setup.indexSize}`);
  }
  const positive = (name: string, value: number, orZero: boolean): void => {
    const ok = Number.isFinite(value) && (orZero ? value >= 0 : value > 0);
    if (!ok)
      bad(
        "bad_setting",
        `${name} expected a finite number ${orZero ? ">= 0" : "> 0"}, found ${value}`,
      );
  };
  positive("alpha", s.alpha, false);
  positive("beta", s.beta, true);
  positive("lambda1", s.lambda1, true);
  positive("lambda2", s.lambda2, true);
  positive("sliceHours", s.sliceHours, false);
  const rates = setup.outcomes.map((outcome) => s.negativeKeepRate[outcome] ?? 1);
  rates.forEach((rate, head) => {
    if (!(rate > 0 && rate <= 1)) {
      bad(
        "bad_keep_rate",
        `negativeKeepRate of "${setup.outcomes[head]}" expected a number in (0, 1], found ${rate}`,
      );
    }
  });
  if (s.averaging !== null) {
    const { halfLifeRows, everyRows } = s.averaging;
    for (const [name, value] of [
      ["halfLifeRows", halfLifeRows],
      ["everyRows", everyRows],
    ] as const) {
      if (!Number.isSafeInteger(value) || value < 1) {
        bad("bad_setting", `averaging.${name} expected a whole number >= 1, found ${value}`);
      }
    }
  }
  if (!Number.isInteger(setup.seed) || setup.seed < 0 || setup.seed > 0xffffffff) {
    bad("bad_seed", `seed expected an integer in [0, 2^32), found ${setup.seed}`);
  }
  if (issues.length > 0) throw new LeafcastError("heads", issues);
  return {
    outcomes: [...setup.outcomes],
    alpha: s.alpha,
    beta: s.beta,
    lambda1: s.lambda1,
    lambda2: s.lambda2,
    negativeKeepRate: rates,
    downsampleCorrection: s.downsampleCorrection,
    sliceHours: s.sliceHours,
    averaging:
      s.averaging === null
        ? null
        : { halfLifeRows: s.averaging.halfLifeRows, everyRows: s.averaging.everyRows },
    seed: setup.seed,
    encoding: setup.encoding,
    indexSize: setup.indexSize,
    treesFingerprint: setup.treesFingerprint,
    schemaFingerprint: setup.schemaFingerprint,
  };
}
