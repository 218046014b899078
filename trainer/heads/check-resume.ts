import { LeafcastError, type Issue } from "../errors.js";
import type { HeadSetup } from "./head-setup.js";
import type { HeadState } from "./head-state.js";
import { resolveHeadStateInfo, type HeadStateInfo } from "./resolve-head-state-info.js";

/**
 * Refuses to resume a saved state under a setup other than the one it was learned
 * under: other trees or another schema give its coordinates another meaning,
 * another encoding or index space moves them, and other FTRL or downsampling
 * settings would make the result differ from one uninterrupted run. Every
 * difference is reported at once.
 *
 * @example
 * checkResume(await loadHeadState("heads.state"), setup); // throws LeafcastError "trees_changed", ...
 */
export function checkResume(state: HeadState, setup: HeadSetup, file = "<head state>"): void {
  const wanted = resolveHeadStateInfo(setup);
  const saved = state.info;
  const issues: Issue[] = [];
  const compare = (code: string, what: string, found: unknown, expected: unknown): void => {
    const a = JSON.stringify(expected);
    const b = JSON.stringify(found);
    if (a !== b) {
      issues.push({
        code,
        message: `cannot resume: ${what} expected ${a} (as the saved heads were learned), found ${b}`,
        file,
      });
    }
  };
  compare("trees_changed", "trees fingerprint", wanted.treesFingerprint, saved.treesFingerprint);
  compare(
    "schema_changed",
    "schema fingerprint",
    wanted.schemaFingerprint,
    saved.schemaFingerprint,
  );
  compare("outcomes_changed", "outcomes", wanted.outcomes, saved.outcomes);
  compare("index_space_changed", "index-space size", wanted.indexSize, saved.indexSize);
  compare("encoding_changed", "encoding", canonical(wanted.encoding), canonical(saved.encoding));
  const settings: (keyof HeadStateInfo)[] = [
    "alpha",
    "beta",
    "lambda1",
    "lambda2",
    "negativeKeepRate",
    "downsampleCorrection",
    "sliceHours",
    "averaging",
    "seed",
  ];
  for (const key of settings) compare("settings_changed", key, wanted[key], saved[key]);
  if (issues.length > 0) throw new LeafcastError("heads", issues);
}

/** The encoding with keys in a fixed order, so key order never counts as a difference. */
function canonical(encoding: HeadStateInfo["encoding"]): unknown {
  return {
    hashBits: encoding.hashBits,
    hashSeed: encoding.hashSeed,
    hashed: encoding.hashed,
    crosses: encoding.crosses,
    numeric: encoding.numeric.map((f) => ({ name: f.name, mean: f.mean, std: f.std })),
  };
}
