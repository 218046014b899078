import type { Command } from "commander";
import { parseNonNegativeInteger } from "../parse-options.js";
import { runHeadCommand, type HeadCommandOptions } from "../../pipeline/run-head-command.js";

/** `leafcast update-heads FILES... --schema S --trees forests.json --heads heads.state --out new.state`. */
export function registerUpdateHeadsCommand(program: Command): void {
  program
    .command("update-heads")
    .description(
      "Continue saved heads on new logs without refitting the trees; refuses heads learned on other trees or another schema.",
    )
    .argument("<files...>", "new data files, oldest first, after the rows the heads have seen")
    .requiredOption("-s, --schema <path>", "dataset schema (JSON)")
    .requiredOption("-t, --trees <path>", "forest file the heads were learned on")
    .requiredOption("-H, --heads <path>", "saved head state to continue")
    .option("-c, --config <path>", "training configuration (JSON); defaults otherwise")
    .requiredOption(
      "-o, --out <path>",
      "head state to write (written atomically, once complete); progress is kept in <out>.checkpoint until then",
    )
    .option("--skip-bad-rows", "count and set aside bad rows instead of stopping at the first")
    .option("--rejects <path>", "with --skip-bad-rows: write the bad rows here (NDJSON)")
    .option(
      "--checkpoint-seconds <s>",
      "also save a checkpoint every this many seconds (besides every checkpoint.everyRows rows)",
      parseNonNegativeInteger,
    )
    .option("--restart", "ignore a checkpoint left by an earlier run and start over")
    .option("-q, --quiet", "no checkpoint lines")
    .option("--json", "print a JSON summary")
    .action(async (files: string[], options: HeadCommandOptions) => {
      await runHeadCommand("update-heads", files, options);
    });
}
