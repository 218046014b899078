#!/usr/bin/env node
import { realpathSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { Command, CommanderError } from "commander";
import { LeafcastError } from "../errors.js";
import { toolVersion } from "../tool-version.js";
import { registerDemoCommand } from "./commands/demo.js";
import { registerDescribeScorerCommand } from "./commands/describe-scorer.js";
import { registerExportScorerCommand } from "./commands/export-scorer.js";
import { registerLatencyCommand } from "./commands/latency.js";
import { registerScoreCommand } from "./commands/score-file.js";
import { ScorerError } from "../../scorer/scorer-error.js";
import { registerFitTreesCommand } from "./commands/fit-trees.js";
import { registerInspectCommand } from "./commands/inspect.js";
import { registerLearnHeadsCommand } from "./commands/learn-heads.js";
import { registerPruneFeaturesCommand } from "./commands/prune-features.js";
import { registerReportCommand } from "./commands/report.js";
import { registerScenarioCommand } from "./commands/scenario.js";
import { registerUpdateHeadsCommand } from "./commands/update-heads.js";

/** Builds the command-line program; exported so tests can run commands in-process. */
export function buildProgram(): Command {
  const program = new Command("leafcast")
    .description(
      "Trees as feature transforms, FTRL-Proximal heads per outcome, and a dependency-free JSON scorer for engagement ranking.",
    )
    .version(toolVersion, "--version")
    .showHelpAfterError("(run with --help for usage)");
  registerScenarioCommand(program);
  registerInspectCommand(program);
  registerFitTreesCommand(program);
  registerLearnHeadsCommand(program);
  registerUpdateHeadsCommand(program);
  registerExportScorerCommand(program);
  registerScoreCommand(program);
  registerDescribeScorerCommand(program);
  registerLatencyCommand(program);
  registerPruneFeaturesCommand(program);
  registerReportCommand(program);
  registerDemoCommand(program);
  return program;
}

/** Runs the program; LeafcastErrors become a clear message and exit code 2, nothing else is hidden. */
export async function runCli(argv: readonly string[]): Promise<number> {
  const program = buildProgram().exitOverride();
  // Subcommands copy settings when created, so they need the override too.
  for (const command of program.commands) command.exitOverride();
  try {
    await program.parseAsync([...argv], { from: "user" });
    return 0;
  } catch (error) {
    if (error instanceof CommanderError) return error.exitCode;
    if (error instanceof LeafcastError || error instanceof ScorerError) {
      process.stderr.write(`${error.message}\n`);
      return 2;
    }
    throw error;
  }
}

// Through npm's bin link argv[1] is a symlink, so compare real paths.
const invokedDirectly =
  process.argv[1] !== undefined && realpathSync(process.argv[1]) === fileURLToPath(import.meta.url);
if (invokedDirectly) {
  process.exitCode = await runCli(process.argv.slice(2));
}
