import { createScorer } from "../../scorer/create-scorer.js";
import { encodedLayout } from "../../scorer/encoded-layout.js";
import { RowEncoder } from "../../scorer/row-encoder.js";
import { exportHeadModels } from "../heads/export-head-models.js";
import { fingerprintForests } from "../heads/fingerprint-forests.js";
import { fingerprintSchema } from "../heads/fingerprint-schema.js";
import type { HeadBatch, HeadSetup } from "../heads/head-setup.js";
import { learnHeads } from "../heads/learn-heads.js";
import { normalizedEntropy } from "../metrics/normalized-entropy.js";
import { headBatchOf } from "../pipeline/head-batch-of.js";
import { headEncodingSpec } from "../pipeline/head-encoding-spec.js";
import { measureNumericStats } from "../pipeline/measure-numeric-stats.js";
import type { ResolvedSchema } from "../schema/load-dataset-schema.js";
import type { ResolvedTrainingConfig } from "../schema/load-training-config.js";
import type { ForestFile } from "../trees/forest-file.js";
import type { PruningSample } from "./read-pruning-sample.js";
import { sampleBatches } from "./sample-batches.js";

/**
 * Held-out NE of the served hybrid: learns one FTRL-Proximal head per outcome
 * (config.heads) over the forests' leaves on the sample's training rows, in
 * sample order, the way learnHeadsFromFiles does for files (the scorer's
 * RowEncoder, numeric means and stds from the first batch), then scores the
 * held-out rows through createScorer. `schema` is the step's (reduced) schema,
 * so hashed categoricals follow the drops. Outcomes whose training rate is 0 or
 * 1 have no NE and are left out.
 *
 * @example
 * const ne = await hybridHeldOutNe(step.forests, sample, reducedSchema, config);
 * ne.reply; // e.g. 0.95
 */
export async function hybridHeldOutNe(
  forestFile: ForestFile,
  sample: PruningSample,
  schema: ResolvedSchema,
  config: ResolvedTrainingConfig,
): Promise<Record<string, number>> {
  const settings = config.heads;
  const outcomes = (settings.outcomes ?? schema.outcomes).filter((o) => {
    const rate = sample.trainingRate.get(o) ?? 0;
    return rate > 0 && rate < 1;
  });
  const forests = forestFile.forests.map((f) => f.forest);
  const contract = forestFile.contract;
  const batchRows = config.batchRows;
  const trainBatches = [...sampleBatches(sample.train, sample.dictionaries, schema, batchRows)];
  const numeric =
    settings.numeric.length === 0 || trainBatches.length === 0
      ? []
      : measureNumericStats(trainBatches[0], settings.numeric);
  const encoding = headEncodingSpec(settings, schema, contract, numeric);
  const setup: HeadSetup = {
    outcomes,
    settings,
    encoding,
    indexSize: encodedLayout(forests, encoding).width,
    seed: config.seed,
    treesFingerprint: fingerprintForests(forests, contract),
    schemaFingerprint: fingerprintSchema(schema),
  };
  const encoder = new RowEncoder({ contract, forests, encoding });
  const buffers = encoder.allocate(batchRows);
  const columns = { outcomes, weight: schema.weight, timestamp: schema.timestamp };
  function* headBatches(): Generator<HeadBatch> {
    for (const batch of trainBatches) yield headBatchOf(batch, encoder, buffers, columns);
  }
  // On this thread: the sample is small, and a worker round trip per batch would cost more.
  const state = await learnHeads(headBatches(), setup, { workers: 0 });
  const heads = exportHeadModels(state);
  const scorer = createScorer({
    contract,
    forests,
    encoding,
    heads,
    valueWeights: heads.map(() => 1),
  });
  const held = sample.heldOut;
  const predicted = outcomes.map(() => new Float64Array(held.rowCount));
  let at = 0;
  for (const batch of sampleBatches(held, sample.dictionaries, schema, batchRows)) {
    const scores = scorer.scoreBatch(batch);
    outcomes.forEach((o, h) =>
      predicted[h].set(scores.probability[o].subarray(0, batch.rowCount), at),
    );
    at += batch.rowCount;
  }
  const ne: Record<string, number> = {};
  outcomes.forEach((o, h) => {
    const label = held.labels.get(o) as Uint8Array;
    ne[o] = normalizedEntropy(
      predicted[h],
      label,
      sample.trainingRate.get(o) as number,
      held.weight ?? undefined,
    );
  });
  return ne;
}
