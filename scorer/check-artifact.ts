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
      `expected "${ARTIFACT_FORMAT}", found ${describeFound(format)}: this is not a Leafcast scorer artifact`,
    );
  }
  const version = Object.prototype.hasOwnProperty.call(doc, "formatVersion")
    ? doc.formatVersion
    : undefined;
  if (version !== ARTIFACT_FORMAT_VERSION) {
    fail(
      "version",
      "/formatVersion",
      `expected format version ${ARTIFACT_FORMAT_VERSION} (the only version this runtime reads), found ${describeFound(version)}`,
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

/**
 * A short description of any value, for a message. JSON.stringify would recurse
 * through a hostile 100,000-level value (RangeError) and throws on a BigInt.
 */
function describeFound(value: unknown): string {
  if (value === undefined) return "nothing";
  if (typeof value === "string")
    return JSON.stringify(value.length > 40 ? `${value.slice(0, 40)}...` : value);
  if (typeof value === "number" || typeof value === "boolean") return String(value);
  if (value === null) return "null";
  if (Array.isArray(value)) return `an array of ${value.length}`;
  return typeof value === "object" ? "an object" : `a ${typeof value}`;
}

function fail(code: string, path: string, message: string): never {
  throw new ScorerError("artifact", [{ code, path, message }]);
}
