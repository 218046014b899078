import { artifactSchemaDocument, type ScorerArtifact } from "./artifact.generated.js";
import { artifactChecksum } from "./artifact-checksum.js";
import { ARTIFACT_FORMAT, ARTIFACT_FORMAT_VERSION } from "./artifact-format.js";
import { checkJsonSchema, type JsonSchema } from "./json-schema-check.js";
import { ScorerError } from "./scorer-error.js";

/**
 * Checks a parsed artifact document, in the order that gives the clearest
 * refusal: format and version first (another version has another layout), then
 * the schema (types, required fields; a string or null where a number belongs),
 * then the checksum. Semantic checks follow in modelFromArtifact.
 *
 * @example
 * const artifact = checkArtifact(JSON.parse(text)); // throws ScorerError("artifact", ...) when damaged
 */
export function checkArtifact(document: unknown): ScorerArtifact {
  if (typeof document !== "object" || document === null || Array.isArray(document)) {
    fail(
      "not_an_object",
      "",
      `expected a JSON object, found ${document === null ? "null" : Array.isArray(document) ? "an array" : typeof document}`,
    );
  }
  const doc = document as { readonly [key: string]: unknown };
  const format = Object.prototype.hasOwnProperty.call(doc, "format") ? doc.format : undefined;
  if (format !== ARTIFACT_FORMAT) {
    fail(
      "format",
      "/format",
      `expected "${ARTIFACT_FORMAT}", found ${JSON.stringify(format) ?? "nothing"}: this is not a Leafcast scorer artifact`,
    );
  }
  const version = Object.prototype.hasOwnProperty.call(doc, "formatVersion")
    ? doc.formatVersion
    : undefined;
  if (version !== ARTIFACT_FORMAT_VERSION) {
    fail(
      "version",
      "/formatVersion",
      `expected format version ${ARTIFACT_FORMAT_VERSION} (the only version this runtime reads), found ${JSON.stringify(version) ?? "nothing"}`,
    );
  }
  const issues = checkJsonSchema(artifactSchemaDocument as JsonSchema, document);
  if (issues.length > 0) {
    throw new ScorerError(
      "artifact",
      issues.map((issue) => ({ code: issue.code, path: issue.path, message: issue.message })),
    );
  }
  const artifact = document as ScorerArtifact;
  const computed = artifactChecksum(artifact);
  if (computed !== artifact.checksum) {
    fail(
      "checksum",
      "/checksum",
      `expected ${computed} (computed over the content), found ${artifact.checksum}: the file was changed after export or is damaged`,
    );
  }
  return artifact;
}

function fail(code: string, path: string, message: string): never {
  throw new ScorerError("artifact", [{ code, path, message }]);
}
