import type { JsonSchema } from "../../scorer/json-schema-check.js";
import type { HeadStateInfo } from "./resolve-head-state-info.js";

/** Format name and version of the head-state file (see encode-head-state.ts). */
export const HEAD_STATE_FORMAT = "leafcast-head-state";
export const HEAD_STATE_VERSION = 2;
/** Versions this build reads: 1 had no weight averaging. */
export const READABLE_HEAD_STATE_VERSIONS: readonly number[] = [1, 2];

/** The JSON header of a head-state file; the binary sections follow it. */
export interface HeadStateHeader {
  readonly format: typeof HEAD_STATE_FORMAT;
  readonly version: number;
  readonly byteOrder: "little-endian";
  readonly info: HeadStateInfo;
  readonly rowCount: number;
  readonly firstTimestamp: number | null;
  readonly lastTimestamp: number | null;
  /** Slice numbers floor(timestamp / sliceMs), in the order of the slice section. */
  readonly sliceIndexes: readonly number[];
  /** Coordinates with a non-zero z or n for some head; the others are all zero. */
  readonly storedCoordinates: number;
  readonly statFields: number;
  /** Under info.averaging: HeadState.averageMass (and the averaged-weight section follows n). */
  readonly averageMass?: number;
}

const nullableNumber = { anyOf: [{ type: "number" }, { type: "null" }] };
const names = { type: "array", items: { type: "string" } };

/**
 * Checks a decoded header before any of it is trusted (checked with the project's
 * JSON Schema checker, scorer/json-schema-check.ts).
 *
 * @example
 * checkJsonSchema(headStateHeaderSchema, JSON.parse(headerText)); // [] when valid
 */
export const headStateHeaderSchema: JsonSchema = {
  type: "object",
  required: [
    "format",
    "version",
    "byteOrder",
    "info",
    "rowCount",
    "firstTimestamp",
    "lastTimestamp",
    "sliceIndexes",
    "storedCoordinates",
    "statFields",
  ],
  properties: {
    format: { const: HEAD_STATE_FORMAT },
    version: { enum: [...READABLE_HEAD_STATE_VERSIONS] },
    byteOrder: { const: "little-endian" },
    rowCount: { type: "integer", minimum: 0 },
    firstTimestamp: nullableNumber,
    lastTimestamp: nullableNumber,
    sliceIndexes: { type: "array", items: { type: "integer" }, uniqueItems: true },
    storedCoordinates: { type: "integer", minimum: 0 },
    statFields: { type: "integer", minimum: 1 },
    averageMass: { type: "number", minimum: 0, maximum: 1 },
    info: {
      type: "object",
      required: [
        "outcomes",
        "alpha",
        "beta",
        "lambda1",
        "lambda2",
        "negativeKeepRate",
        "downsampleCorrection",
        "sliceHours",
        "seed",
        "encoding",
        "indexSize",
        "treesFingerprint",
        "schemaFingerprint",
      ],
      properties: {
        outcomes: { ...names, minItems: 1, uniqueItems: true },
        alpha: { type: "number", exclusiveMinimum: 0 },
        beta: { type: "number", minimum: 0 },
        lambda1: { type: "number", minimum: 0 },
        lambda2: { type: "number", minimum: 0 },
        negativeKeepRate: {
          type: "array",
          items: { type: "number", exclusiveMinimum: 0, maximum: 1 },
        },
        downsampleCorrection: { enum: ["weight", "recalibrate"] },
        sliceHours: { type: "number", exclusiveMinimum: 0 },
        averaging: {
          anyOf: [
            { type: "null" },
            {
              type: "object",
              required: ["halfLifeRows", "everyRows"],
              properties: {
                halfLifeRows: { type: "integer", minimum: 1 },
                everyRows: { type: "integer", minimum: 1 },
              },
            },
          ],
        },
        seed: { type: "integer", minimum: 0, maximum: 4294967295 },
        indexSize: { type: "integer", minimum: 0, maximum: 2147483646 },
        treesFingerprint: { type: "string" },
        schemaFingerprint: { type: "string" },
        encoding: {
          type: "object",
          required: ["hashBits", "hashSeed", "hashed", "crosses", "numeric"],
          properties: {
            hashBits: { type: "integer", minimum: 0 },
            hashSeed: { type: "integer", minimum: 0 },
            hashed: names,
            crosses: { type: "array", items: names },
            numeric: {
              type: "array",
              items: {
                type: "object",
                required: ["name", "mean", "std"],
                properties: {
                  name: { type: "string" },
                  mean: { type: "number" },
                  std: { type: "number" },
                },
              },
            },
          },
        },
      },
    },
  },
};
