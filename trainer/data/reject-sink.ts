import { LeafcastError } from "../errors.js";
import type { MutableReadStats, RejectRecord } from "./read-types.js";
import type { RejectsWriter } from "./rejects-writer.js";

/**
 * Applies the bad-row policy: under "fail" the first bad row throws; under
 * "skip" it is counted by code and kept for the rejects file until the reader
 * next flushes (readers flush once per chunk, so memory stays bounded).
 *
 * @example
 * const sink = new RejectSink("csv", "plots.csv", "skip", stats, null);
 * sink.reject(17, "tie_strength", "not_a_number", 'column "tie_strength" expected a number, found "n/a"', "4,n/a,1");
 * stats.rejectedByCode; // { not_a_number: 1 }
 */
export class RejectSink {
  private pending: RejectRecord[] = [];

  constructor(
    readonly source: string,
    readonly file: string,
    readonly policy: "fail" | "skip",
    private readonly stats: MutableReadStats,
    private readonly writer: RejectsWriter | null,
  ) {}

  /** Records a bad row; throws under the "fail" policy. `reason` says expected versus found. */
  reject(row: number, column: string | null, code: string, reason: string, raw: string): void {
    if (this.policy === "fail") {
      throw new LeafcastError(this.source, [
        column === null
          ? { code, message: reason, file: this.file, row }
          : { code, message: reason, file: this.file, row, column },
      ]);
    }
    this.stats.rowsRejected += 1;
    this.stats.rejectedByCode[code] = (this.stats.rejectedByCode[code] ?? 0) + 1;
    if (this.writer !== null) {
      this.pending.push({ file: this.file, row, column, code, reason, raw });
    }
  }

  /** Writes the rows rejected since the last flush. */
  async flush(): Promise<void> {
    if (this.pending.length === 0 || this.writer === null) return;
    const records = this.pending;
    this.pending = [];
    await this.writer.write(records);
  }

  /** Flushes and puts the rejects file in place. */
  async finish(): Promise<void> {
    if (this.writer === null) return;
    await this.flush();
    await this.writer.commit();
    this.stats.rejectsPath = this.writer.path;
  }

  /** Drops the rejects file after a failed or abandoned read. */
  async abandon(): Promise<void> {
    this.pending = [];
    await this.writer?.discard();
  }
}
