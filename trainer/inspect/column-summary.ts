import type { ColumnData } from "../data/column-batch.js";
import type { ColumnRole } from "../schema/load-dataset-schema.js";

/** What `inspect` reports for one column, accumulated over every batch. */
export interface ColumnSummaryReport {
  readonly name: string;
  readonly role: ColumnRole;
  readonly rows: number;
  readonly missing: number;
  /** Numbers: min, mean, max over present values. Timestamps: ISO first and last. */
  readonly min?: number | string;
  readonly mean?: number;
  readonly max?: number | string;
  /** Outcomes: share of 1s. */
  readonly positiveRate?: number;
  readonly positives?: number;
  /** Categories: distinct values seen and the most frequent ones. */
  readonly distinct?: number;
  readonly top?: readonly { readonly value: string; readonly rows: number }[];
}

/**
 * Streams one column's summary over batches without keeping the rows.
 *
 * @example
 * const s = new ColumnSummary("tie_strength", "numeric");
 * for await (const batch of reader.batches()) s.add(batch.columns.get("tie_strength")!);
 * s.report(); // { rows, missing, min, mean, max, ... }
 */
export class ColumnSummary {
  private rows = 0;
  private missing = 0;
  private min = Infinity;
  private max = -Infinity;
  private sum = 0;
  private positives = 0;
  private readonly counts: number[] = [];
  private categories: readonly string[] = [];

  constructor(
    readonly name: string,
    readonly role: ColumnRole,
  ) {}

  add(column: ColumnData): void {
    if (column.kind === "number") this.addNumbers(column.values);
    else if (column.kind === "label") this.addLabels(column.values);
    else this.addCodes(column.codes, column.dictionary.list());
  }

  private addNumbers(values: Float64Array): void {
    let { min, max, sum, missing } = this;
    for (let i = 0; i < values.length; i++) {
      const x = values[i];
      if (x !== x) {
        missing++;
        continue;
      }
      if (x < min) min = x;
      if (x > max) max = x;
      sum += x;
    }
    Object.assign(this, { min, max, sum, missing });
    this.rows += values.length;
  }

  private addLabels(values: Uint8Array): void {
    let positives = 0;
    for (let i = 0; i < values.length; i++) positives += values[i];
    this.positives += positives;
    this.rows += values.length;
  }

  private addCodes(codes: Int32Array, dictionary: readonly string[]): void {
    this.categories = dictionary;
    const counts = this.counts;
    for (let i = 0; i < codes.length; i++) {
      const code = codes[i];
      if (code < 0) {
        this.missing++;
        continue;
      }
      counts[code] = (counts[code] ?? 0) + 1;
    }
    this.rows += codes.length;
  }

  report(topCount = 5): ColumnSummaryReport {
    const base = { name: this.name, role: this.role, rows: this.rows, missing: this.missing };
    const present = this.rows - this.missing;
    if (this.role === "outcome") {
      return {
        ...base,
        positives: this.positives,
        positiveRate: this.rows > 0 ? this.positives / this.rows : 0,
      };
    }
    if (this.role === "categorical" || this.role === "group") {
      const top = this.counts
        .map((rows, code) => ({ value: this.categories[code] ?? String(code), rows }))
        .filter((entry) => entry.rows > 0)
        .sort((a, b) => b.rows - a.rows || (a.value < b.value ? -1 : 1))
        .slice(0, topCount);
      return { ...base, distinct: this.counts.filter((c) => c > 0).length, top };
    }
    if (present === 0) return base;
    if (this.role === "timestamp") {
      return {
        ...base,
        min: new Date(this.min).toISOString(),
        max: new Date(this.max).toISOString(),
      };
    }
    return { ...base, min: this.min, mean: this.sum / present, max: this.max };
  }
}
