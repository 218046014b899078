import { LeafcastError } from "../errors.js";
import type { ResolvedSchema } from "../schema/load-dataset-schema.js";

/**
 * Checks the study's own options (the window cut is checked by planStudyWindows)
 * before any fitting starts; every problem at once, one LeafcastError ("study").
 *
 * @example
 * checkStudyOptions(schema, { psiThreshold: 0, driftFromDay: 22, segmentColumn: "post_type" });
 * // throws: study: PSI threshold expected a positive number, found 0
 */
export function checkStudyOptions(
  schema: ResolvedSchema,
  options: {
    readonly psiThreshold?: number;
    readonly driftFromDay?: number;
    readonly segmentColumn?: string | null;
  },
): void {
  const problems: string[] = [];
  const threshold = options.psiThreshold ?? 0.25;
  if (!(threshold > 0 && threshold < Infinity))
    problems.push(`PSI threshold expected a positive number, found ${threshold}`);
  const drift = options.driftFromDay;
  if (drift !== undefined && !(Number.isSafeInteger(drift) && drift >= 1))
    problems.push(`drift day expected a whole number >= 1, found ${drift}`);
  const segment = options.segmentColumn ?? null;
  if (segment !== null && schema.byName.get(segment)?.role !== "categorical")
    problems.push(
      `segment column expected a categorical column of schema "${schema.name}", found ${JSON.stringify(segment)}`,
    );
  if (problems.length > 0)
    throw new LeafcastError(
      "study",
      problems.map((message) => ({ code: "bad_option", message })),
    );
}
