import type { Command } from "commander";
import { addHeadRunOptions } from "./head-run-options.js";
import { runHeadCommand, type HeadCommandOptions } from "../../pipeline/run-head-command.js";

/** `leafcast learn-heads FILES... --schema S --trees forests.json --out heads.state`: fresh heads. */
export function registerLearnHeadsCommand(program: Command): void {
  const command = program
    .command("learn-heads")
    .description(
      "Learn one FTRL-Proximal head per outcome on the given logs, read in order, over the leaves of saved trees.",
    )
    .argument("<files...>", "data files, oldest first")
    .requiredOption("-s, --schema <path>", "dataset schema (JSON)")
    .requiredOption("-t, --trees <path>", "forest file written by fit-trees");
  addHeadRunOptions(command).action(async (files: string[], options: HeadCommandOptions) => {
    await runHeadCommand("learn-heads", files, { ...options, heads: undefined });
  });
}
