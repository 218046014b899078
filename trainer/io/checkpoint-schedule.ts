/**
 * Decides when a long run saves a checkpoint: after every `everyUnits` units of
 * work (trees, rows) and/or once `everySeconds` have passed since the last save,
 * whichever comes first; 0 turns a rule off. Only ever asked between units, so a
 * checkpoint always lands on a boundary the run can continue from exactly.
 *
 * @example
 * const schedule = new CheckpointSchedule(10, 60);
 * if (schedule.advance(1)) await saveCheckpoint(); // true after the 10th tree, or a minute
 */
export class CheckpointSchedule {
  private units = 0;
  private last: number;

  constructor(
    private readonly everyUnits: number,
    private readonly everySeconds: number,
    private readonly now: () => number = () => performance.now(),
  ) {
    this.last = now();
  }

  /** Counts `units` more done; true when a checkpoint is due now (the counters then restart). */
  advance(units: number): boolean {
    this.units += units;
    const byUnits = this.everyUnits > 0 && this.units >= this.everyUnits;
    const bySeconds = this.everySeconds > 0 && this.now() - this.last >= 1000 * this.everySeconds;
    if (!byUnits && !bySeconds) return false;
    this.reset();
    return true;
  }

  /** Restarts both counters, e.g. after a checkpoint another rule asked for. */
  reset(): void {
    this.units = 0;
    this.last = this.now();
  }
}
