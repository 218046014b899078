const numberArray = { type: "array", items: { type: "number" } };
const name = { type: "string", minLength: 1 };

/**
 * The JSON Schema of a forest file (the structure; read-forest-file.ts adds the
 * checks a schema cannot state, such as array lengths that follow the depth).
 * Checked with scorer/json-schema-check.ts, the checker every Leafcast format uses.
 *
 * @example
 * checkJsonSchema(forestFileSchema, JSON.parse(text)); // [] when the structure is right
 */
export const forestFileSchema = {
  type: "object",
  additionalProperties: false,
  required: ["format", "version", "seed", "settings", "features", "binEdges", "forests"],
  properties: {
    format: { const: "leafcast-forests" },
    version: { const: 1 },
    seed: { type: "integer", minimum: 0, maximum: 4294967295 },
    settings: {
      type: "object",
      required: [
        "count",
        "depth",
        "leaves",
        "learningRate",
        "bins",
        "binSampleRows",
        "l2",
        "minLeafHessian",
        "minSplitGain",
        "rowFraction",
        "featureFraction",
        "maxCategories",
        "validationFraction",
        "patience",
        "sampleRows",
        "minForestRate",
        "outcomes",
      ],
      properties: {
        outcomes: { anyOf: [{ type: "null" }, { type: "array", items: name }] },
      },
    },
    features: {
      type: "object",
      additionalProperties: false,
      required: ["numeric", "categorical"],
      properties: {
        numeric: { type: "array", items: name },
        categorical: {
          type: "array",
          items: {
            type: "object",
            additionalProperties: false,
            required: ["name", "values"],
            properties: { name, values: { type: "array", items: { type: "string" } } },
          },
        },
      },
    },
    binEdges: {
      type: "array",
      items: {
        type: "object",
        additionalProperties: false,
        required: ["feature", "edges"],
        properties: { feature: name, edges: { ...numberArray, minItems: 1, maxItems: 255 } },
      },
    },
    forests: {
      type: "array",
      items: {
        type: "object",
        additionalProperties: false,
        required: [
          "outcome",
          "baseLogit",
          "depth",
          "treesFitted",
          "startTrainLoss",
          "startValidationLoss",
          "trainLoss",
          "validationLoss",
          "importance",
          "trees",
        ],
        properties: {
          outcome: name,
          baseLogit: { type: "number" },
          depth: { type: "integer", minimum: 1, maximum: 16 },
          treesFitted: { type: "integer", minimum: 0 },
          startTrainLoss: { type: "number" },
          startValidationLoss: { type: ["number", "null"] },
          trainLoss: numberArray,
          validationLoss: { anyOf: [{ type: "null" }, numberArray] },
          importance: {
            type: "array",
            items: {
              type: "object",
              additionalProperties: false,
              required: ["feature", "gain", "cover", "splits"],
              properties: {
                feature: name,
                gain: { type: "number" },
                cover: { type: "number" },
                splits: { type: "integer", minimum: 0 },
              },
            },
          },
          trees: {
            type: "array",
            items: {
              type: "object",
              additionalProperties: false,
              required: ["feature", "threshold", "missingRight", "rightCategories", "leafValue"],
              properties: {
                feature: { type: "array", items: { type: "integer", minimum: -1 } },
                threshold: numberArray,
                missingRight: { type: "array", items: { enum: [0, 1] } },
                rightCategories: {
                  type: "array",
                  items: {
                    anyOf: [
                      { type: "null" },
                      { type: "array", items: { type: "integer", minimum: 0, maximum: 253 } },
                    ],
                  },
                },
                leafValue: numberArray,
              },
            },
          },
        },
      },
    },
  },
};
