import type { EncodedBuffers, RowEncoder } from "../../scorer/row-encoder.js";
import { labelColumn, numberColumn, type ColumnBatch } from "../data/column-batch.js";
import type { HeadBatch } from "../heads/head-setup.js";

/** Which columns of a read batch feed the heads. */
export interface HeadColumns {
  /** Outcome columns, one per head, in head order. */
  readonly outcomes: readonly string[];
  readonly weight: string | null;
  readonly timestamp: string | null;
}

/**
 * Turns a read batch into a head batch: the features encoded by the scorer's
 * RowEncoder straight from the batch's typed columns (a ColumnBatch is a
 * ColumnarBatch: category codes with their dictionary, numbers as Float64Array;
 * no row becomes an object), and the label, weight and timestamp columns as
 * they are. The encoded arrays live in `buffers` until the next call.
 *
 * @example
 * const batch = headBatchOf(columns, encoder, buffers, { outcomes: ["open"], weight: null, timestamp: "timestamp" });
 */
export function headBatchOf(
  batch: ColumnBatch,
  encoder: RowEncoder,
  buffers: EncodedBuffers,
  columns: HeadColumns,
): HeadBatch {
  const encoded = encoder.encode(batch, buffers);
  // The heads take exactly rowCount + 1 offsets; a short last batch sees a view of the buffers.
  const offsets = encoded.offsets.subarray(0, encoded.rowCount + 1);
  return {
    encoded: { ...encoded, offsets },
    labels: columns.outcomes.map((outcome) => labelColumn(batch, outcome)),
    weights: columns.weight === null ? null : numberColumn(batch, columns.weight),
    timestamps: columns.timestamp === null ? null : numberColumn(batch, columns.timestamp),
  };
}
