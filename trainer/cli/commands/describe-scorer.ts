import { readFile } from "node:fs/promises";
import type { Command } from "commander";
import { checkArtifact } from "../../../scorer/check-artifact.js";
import { describeArtifact } from "../../artifact/describe-artifact.js";
import { formatArtifactDescription } from "../../artifact/format-artifact-description.js";
import { parseJsonText } from "../../schema/parse-json-file.js";

/** `leafcast describe-scorer FILE`: sizes, trees, non-zero weights per head, top features. */
export function registerDescribeScorerCommand(program: Command): void {
  program
    .command("describe-scorer")
    .description(
      "Check a scorer artifact and describe it: sizes, trees, non-zero weights per head, top features.",
    )
    .argument("<artifact>", "scorer artifact (JSON)")
    .option("--json", "print one JSON document")
    .action(async (path: string, options: { json?: boolean }) => {
      const text = await readFile(path, "utf8");
      const artifact = checkArtifact(parseJsonText(text, path, "artifact"));
      const description = describeArtifact(artifact);
      process.stdout.write(
        options.json === true
          ? `${JSON.stringify(description, null, 2)}\n`
          : `${formatArtifactDescription(description)}\n`,
      );
    });
}
