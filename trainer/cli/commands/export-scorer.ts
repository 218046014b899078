import type { Command } from "commander";
import { InvalidArgumentError } from "commander";
import { exportArtifact } from "../../artifact/export-artifact.js";
import { loadHeadState } from "../../heads/load-head-state.js";
import { artifactInputOf } from "../../pipeline/artifact-input-of.js";
import { readForestFile } from "../../trees/read-forest-file.js";

interface ExportOptions {
  readonly trees: string;
  readonly heads: string;
  readonly out: string;
  readonly value: Record<string, number>;
  readonly name?: string;
}

/** `leafcast export-scorer`: turns saved forests and heads into one checksummed scorer artifact. */
export function registerExportScorerCommand(program: Command): void {
  program
    .command("export-scorer")
    .description(
      "Write the scorer artifact (versioned, checksummed JSON) from saved forests and heads.",
    )
    .requiredOption("-t, --trees <path>", "forest file from fit-trees")
    .requiredOption("-H, --heads <path>", "head state from learn-heads or update-heads")
    .requiredOption("-o, --out <path>", "artifact to write (JSON, written atomically)")
    .option(
      "--value <outcome=weight>",
      "value of an outcome in the combined ranking score (repeatable; default 1; give hide a negative value)",
      collectValueWeight,
      {},
    )
    .option("--name <text>", "a name recorded in the artifact's provenance")
    .action(async (options: ExportOptions) => {
      const forests = await readForestFile(options.trees);
      const state = await loadHeadState(options.heads);
      const exported = await exportArtifact(
        options.out,
        artifactInputOf(forests, state, options.value, {
          name: options.name,
          dataWindows: [
            {
              stage: "heads",
              rows: state.rowCount,
              from: state.firstTimestamp === null ? null : new Date(state.firstTimestamp),
              to: state.lastTimestamp === null ? null : new Date(state.lastTimestamp),
            },
          ],
        }),
      );
      process.stdout.write(
        `export-scorer: wrote ${exported.path} (${exported.bytes} bytes, ${exported.checksum})\n`,
      );
    });
}

function collectValueWeight(
  text: string,
  previous: Record<string, number>,
): Record<string, number> {
  const match = /^([^=]+)=(.+)$/.exec(text);
  const value = match === null ? NaN : Number(match[2]);
  if (match === null || !Number.isFinite(value)) {
    throw new InvalidArgumentError(`expected outcome=number such as hide=-20, found "${text}"`);
  }
  return { ...previous, [match[1]]: value };
}
