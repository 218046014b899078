import type { Command } from "commander";
import { addHeadRunOptions } from "./head-run-options.js";
import { runHeadCommand, type HeadCommandOptions } from "../../pipeline/run-head-command.js";

/** `leafcast update-heads FILES... --schema S --trees forests.json --heads heads.state --out new.state`. */
export function registerUpdateHeadsCommand(program: Command): void {
  const command = program
    .command("update-heads")
    .description(
      "Continue saved heads on new logs without refitting the trees; refuses heads learned on other trees or another schema.",
    )
    .argument("<files...>", "new data files, oldest first, after the rows the heads have seen")
    .requiredOption("-s, --schema <path>", "dataset schema (JSON)")
    .requiredOption("-t, --trees <path>", "forest file the heads were learned on")
    .requiredOption("-H, --heads <path>", "saved head state to continue");
  addHeadRunOptions(command).action(async (files: string[], options: HeadCommandOptions) => {
    await runHeadCommand("update-heads", files, options);
  });
}
