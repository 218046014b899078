import type { Command } from "commander";
import { parseNonNegativeInteger } from "../parse-options.js";
import { runHeadCommand, type HeadCommandOptions } from "../../pipeline/run-head-command.js";

/** `leafcast learn-heads FILES... --schema S --trees forests.json --out heads.state`: fresh heads. */
export function registerLearnHeadsCommand(program: Command): void {
  program
    .command("learn-heads")
    .description(
      "Learn one FTRL-Proximal head per outcome on the given logs, read in order, over the leaves of saved trees.",
    )
    .argument("<files...>", "data files, oldest first")
    .requiredOption("-s, --schema <path>", "dataset schema (JSON)")
    .requiredOption("-t, --trees <path>", "forest file written by fit-trees")
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
      await runHeadCommand("learn-heads", files, { ...options, heads: undefined });
    });
}
