import type { HeadBatch, HeadSetup } from "./head-setup.js";
import type { HeadState } from "./head-state.js";
import { learnHeads, type LearnHeadsOptions } from "./learn-heads.js";

/**
 * Continues saved heads on new rows: refuses (LeafcastError "trees_changed",
 * "schema_changed", "index_space_changed", "settings_changed", ...) when the
 * setup differs from the one the state was learned under, then learns on. The
 * state is advanced in place and returned; the new rows should follow the old.
 *
 * @example
 * const saved = await loadHeadState("runs/demo/heads.state");
 * const state = await updateHeads(saved, encodedDays(["day-08.csv"]), setup);
 * await saveHeadState("runs/demo/heads.state", state);
 */
export function updateHeads(
  saved: HeadState,
  batches: AsyncIterable<HeadBatch> | Iterable<HeadBatch>,
  setup: HeadSetup,
  options: Omit<LearnHeadsOptions, "state"> = {},
): Promise<HeadState> {
  return learnHeads(batches, setup, { ...options, state: saved });
}
