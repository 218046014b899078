import type { Command } from "commander";
import { parseNonNegativeInteger } from "../parse-options.js";

/**
 * The options learn-heads and update-heads share: configuration, output,
 * bad rows, checkpoints and output format. Each command adds its own inputs first.
 *
 * @example
 * addHeadRunOptions(program.command("learn-heads").requiredOption("-t, --trees <path>", "forest file"));
 */
export function addHeadRunOptions(command: Command): Command {
  return command
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
    .option("--json", "print a JSON summary");
}
