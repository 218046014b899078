import type { ColumnBatch } from "../data/column-batch.js";
import { numberColumn } from "../data/column-batch.js";

/** Mean and standard deviation of one numeric column, as the heads standardize it. */
export interface NumericStats {
  readonly name: string;
  readonly mean: number;
  readonly std: number;
}

/**
 * Measures the mean and (population) standard deviation of each named numeric
 * column over the finite values of one batch. A column with no finite value
 * gets mean 0, and a constant one std 1, so that standardizing never divides
 * by zero: such a feature then carries no signal rather than infinities.
 *
 * @example
 * measureNumericStats(firstBatch, ["tie_strength"]); // [{ name: "tie_strength", mean: 0.41, std: 0.22 }]
 */
export function measureNumericStats(batch: ColumnBatch, names: readonly string[]): NumericStats[] {
  return names.map((name) => {
    const values = numberColumn(batch, name);
    let count = 0;
    let sum = 0;
    for (let r = 0; r < batch.rowCount; r++) {
      const x = values[r];
      if (Number.isFinite(x)) {
        count++;
        sum += x;
      }
    }
    const mean = count > 0 ? sum / count : 0;
    let squares = 0;
    for (let r = 0; r < batch.rowCount; r++) {
      const x = values[r];
      if (Number.isFinite(x)) squares += (x - mean) * (x - mean);
    }
    const std = count > 0 ? Math.sqrt(squares / count) : 0;
    return { name, mean, std: std > 0 && Number.isFinite(std) ? std : 1 };
  });
}
