import { resolve } from "node:path";
import { loadHeadState } from "../heads/load-head-state.js";
import { removeFileIfPresent } from "../io/remove-file-if-present.js";
import { saveHeadState } from "../heads/save-head-state.js";
import { loadDatasetSchema } from "../schema/load-dataset-schema.js";
import { loadTrainingConfig, resolveTrainingConfig } from "../schema/load-training-config.js";
import { readForestFile } from "../trees/read-forest-file.js";
import { headReportSummary, renderHeadSummary } from "./head-report-summary.js";
import { learnHeadsFromFiles } from "./learn-heads-from-files.js";

/** Options shared by the learn-heads and update-heads commands. */
export interface HeadCommandOptions {
  readonly schema: string;
  readonly trees: string;
  /** update-heads only: the saved heads to continue. */
  readonly heads?: string;
  readonly config?: string;
  readonly out: string;
  readonly skipBadRows?: boolean;
  readonly rejects?: string;
  readonly quiet?: boolean;
  readonly json?: boolean;
  readonly checkpointSeconds?: number;
  readonly restart?: boolean;
}

/**
 * What both head commands do: load schema, configuration, trees and (to update)
 * saved heads, learn over the files with checkpoints kept in `<out>.checkpoint`
 * (resumed from when a run was cut short), save the final state to --out, and
 * print the progressive figures (text or --json). --out is written only once,
 * complete: a run that fails leaves it as it was.
 *
 * @example
 * await runHeadCommand("learn-heads", ["day-01.csv"], { schema: "s.json", trees: "forests.json", out: "heads.state" });
 */
export async function runHeadCommand(
  name: string,
  files: readonly string[],
  options: HeadCommandOptions,
): Promise<void> {
  const schema = await loadDatasetSchema(options.schema);
  const config =
    options.config === undefined
      ? resolveTrainingConfig({})
      : await loadTrainingConfig(options.config);
  const forests = await readForestFile(options.trees);
  const state = options.heads === undefined ? undefined : await loadHeadState(options.heads);
  const log = (line: string): void => {
    if (options.quiet !== true && options.json !== true) process.stderr.write(`${line}\n`);
  };
  const before = state?.rowCount ?? 0;
  const checkpointPath = `${options.out}.checkpoint`;
  const result = await learnHeadsFromFiles(files, schema, config, forests, {
    state,
    checkpointPath,
    checkpointSeconds: options.checkpointSeconds,
    restart: options.restart,
    onCheckpoint: (s) =>
      log(`${name}: checkpoint at ${s.rowCount} rows saved to ${checkpointPath}`),
    onResume: (c) =>
      log(
        `${name}: resuming from ${checkpointPath} at ${c.state.rowCount} rows (file ${c.position.file + 1}, row ${c.position.rows})`,
      ),
    badRows: options.skipBadRows === true ? "skip" : "fail",
    rejectsPath: options.rejects,
  });
  // Saving first keeps the progress if the final write fails (a kill between the
  // two steps resumes and writes the same bytes again). Only when --out is the
  // --heads file the checkpoint was made from does the checkpoint go first: a
  // resume would then start from the new heads and learn the rows twice.
  const inPlace = options.heads !== undefined && resolve(options.heads) === resolve(options.out);
  if (inPlace) await removeFileIfPresent(checkpointPath);
  await saveHeadState(options.out, result.state);
  if (!inPlace) await removeFileIfPresent(checkpointPath);
  const summary = headReportSummary(result.report);
  const rowsRejected = result.reads.reduce((sum, r) => sum + r.rowsRejected, 0);
  const rowsLearned = result.state.rowCount - before;
  if (options.json === true) {
    const body = {
      out: options.out,
      rowsLearned,
      rowsTotal: result.state.rowCount,
      rowsRejected,
      heads: summary,
    };
    process.stdout.write(`${JSON.stringify(body, null, 2)}\n`);
    return;
  }
  const rejected = rowsRejected > 0 ? `, ${rowsRejected} bad rows set aside` : "";
  process.stdout.write(
    `${name}: learned ${rowsLearned} rows (${result.state.rowCount} in all)${rejected}; wrote ${options.out}\n` +
      `progressive validation (each row scored before training on it):\n${renderHeadSummary(summary)}\n`,
  );
}
