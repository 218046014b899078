import type { EncodingSpec, FeatureContract } from "../../scorer/model-types.js";
import { LeafcastError, type Issue } from "../errors.js";
import type { ResolvedSchema } from "../schema/load-dataset-schema.js";
import type { HeadSettings } from "../schema/load-training-config.js";
import type { NumericStats } from "./measure-numeric-stats.js";

/**
 * The heads' encoding from the configuration: hashed columns (config.heads.hashed,
 * or every categorical column of the schema), crosses, and the standardized
 * numerics with their measured mean and std. Every column must be in the trees'
 * feature contract, since the scorer reads the heads' inputs through it; all
 * missing ones are reported at once.
 *
 * @example
 * const encoding = headEncodingSpec(config.heads, schema, forestFile.contract, stats);
 * encoding.hashed; // ["author_id", "post_type", ...]
 */
export function headEncodingSpec(
  settings: HeadSettings,
  schema: ResolvedSchema,
  contract: FeatureContract,
  numeric: readonly NumericStats[],
): EncodingSpec {
  const hashed = settings.hashed ?? schema.categorical;
  const categorical = new Set(contract.categorical.map((c) => c.name));
  const numericNames = new Set(contract.numeric);
  const issues: Issue[] = [];
  const expect = (name: string, known: Set<string>, kind: string, field: string): void => {
    if (!known.has(name)) {
      issues.push({
        code: "not_in_trees",
        message: `${field}: expected "${name}" among the ${kind} features of the trees' contract, found it absent`,
      });
    }
  };
  for (const name of hashed) expect(name, categorical, "categorical", "heads.hashed");
  settings.crosses.forEach((cross, i) => {
    for (const name of cross) expect(name, categorical, "categorical", `heads.crosses[${i}]`);
  });
  for (const s of numeric) expect(s.name, numericNames, "numeric", "heads.numeric");
  if (issues.length > 0) throw new LeafcastError("heads", issues);
  return {
    hashBits: settings.hashBits,
    hashSeed: settings.hashSeed,
    hashed: [...hashed],
    crosses: settings.crosses.map((cross) => [...cross]),
    numeric: numeric.map(({ name, mean, std }) => ({ name, mean, std })),
  };
}
