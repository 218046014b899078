import { checkArtifact } from "./check-artifact.js";
import { modelFromArtifact } from "./model-from-artifact.js";
import { Scorer } from "./scorer.js";
import { ScorerError } from "./scorer-error.js";

/**
 * Loads an artifact (its JSON text, or the parsed document: any value is
 * accepted and checked) into a scorer after
 * checking, in order: JSON syntax, format and version, schema, checksum, then
 * the semantics (lengths, indexes, finite numbers). Throws a ScorerError whose
 * issues name what is wrong and where. Nothing in the file is ever run as code.
 *
 * @example
 * const scorer = loadScorer(await (await fetch("/model.json")).text());
 * scorer.scoreOne({ tie_strength: 0.4, crop: "kale" }).combined;
 */
export function loadScorer(artifact: unknown): Scorer {
  let document: unknown = artifact;
  if (typeof artifact === "string") {
    try {
      document = JSON.parse(artifact) as unknown;
    } catch (error) {
      const reason = error instanceof Error ? error.message : String(error);
      throw new ScorerError("artifact", [
        {
          code: "invalid_json",
          path: "",
          message: `expected JSON text, found a syntax error: ${reason}`,
        },
      ]);
    }
  }
  return new Scorer(modelFromArtifact(checkArtifact(document)), "artifact");
}
