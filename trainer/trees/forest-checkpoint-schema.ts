import type { JsonSchema } from "../../scorer/json-schema-check.js";
import { inputFileIdentitySchema } from "../io/input-file-identity.js";

const text = { type: "string" };
/**
 * The JSON Schema of a tree checkpoint's body (see encode-forest-checkpoint.ts);
 * decodeForestCheckpoint adds the checks a schema cannot state (array lengths
 * that follow a tree's depth).
 *
 * @example
 * checkJsonSchema(forestCheckpointSchema, JSON.parse(body)); // [] when the structure is right
 */
export const forestCheckpointSchema: JsonSchema = {
  type: "object",
  required: ["inputs", "forests"],
  properties: {
    inputs: {
      type: "object",
      required: ["files", "schema", "settings", "sample"],
      properties: {
        files: { type: "array", items: inputFileIdentitySchema },
        schema: text,
        settings: text,
        sample: text,
      },
    },
    forests: {
      type: "array",
      items: {
        type: "object",
        required: [
          "outcome",
          "complete",
          "startLoss",
          "hasValidation",
          "trainLoss",
          "validationLoss",
          "trees",
        ],
        properties: {
          outcome: text,
          complete: { type: "boolean" },
          startLoss: text,
          hasValidation: { type: "boolean" },
          trainLoss: text,
          validationLoss: text,
          trees: {
            type: "array",
            items: {
              type: "object",
              required: [
                "depth",
                "column",
                "threshold",
                "missingRight",
                "rightBins",
                "gain",
                "cover",
                "leafNode",
                "leafDepth",
                "leafValue",
              ],
              properties: {
                depth: { type: "integer", minimum: 0, maximum: 16 },
                rightBins: { type: "array", items: { anyOf: [{ type: "null" }, text] } },
              },
            },
          },
        },
      },
    },
  },
};
