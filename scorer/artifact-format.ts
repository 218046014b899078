/**
 * The artifact format this runtime reads and the trainer writes
 * (schemas/scorer-artifact.schema.json).
 *
 * @example
 * if (doc.formatVersion !== ARTIFACT_FORMAT_VERSION) throw new Error("incompatible artifact");
 */
/** The value of an artifact's "format" field. */
export const ARTIFACT_FORMAT = "leafcast-scorer";
/** The layout version; a runtime reads exactly its own. */
export const ARTIFACT_FORMAT_VERSION = 1;
