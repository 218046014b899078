import {
  loadTrainingConfig,
  resolveTrainingConfig,
  type ResolvedTrainingConfig,
} from "../schema/load-training-config.js";

/** The configuration named by --config, or every default when the option is absent. */
export async function loadConfigOption(path: string | undefined): Promise<ResolvedTrainingConfig> {
  return path === undefined ? resolveTrainingConfig({}) : loadTrainingConfig(path);
}
