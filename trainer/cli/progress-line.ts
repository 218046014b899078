/** Where progress goes: a terminal stream, or anything with the same shape in tests. */
export interface ProgressStream {
  readonly isTTY?: boolean;
  write(text: string): boolean;
}

/**
 * A one-line progress display for long work: done so far, rate per second and,
 * when the total is known, time left. It redraws in place on a terminal and
 * stays silent elsewhere, so piped and machine-readable output stays clean.
 *
 * @example
 * const progress = new ProgressLine("reading", "rows");
 * progress.update(120_000);
 * progress.finish();
 */
export class ProgressLine {
  private readonly started = performance.now();
  private lastDraw = 0;
  private drawn = false;

  constructor(
    private readonly label: string,
    private readonly unit: string,
    private readonly total: number | null = null,
    private readonly stream: ProgressStream = process.stderr,
    private readonly enabled: boolean = stream.isTTY === true,
  ) {}

  /** Records progress; redraws at most four times a second. */
  update(done: number, detail = ""): void {
    if (!this.enabled) return;
    const now = performance.now();
    if (now - this.lastDraw < 250) return;
    this.lastDraw = now;
    this.stream.write(`\r\x1b[2K${this.render(done, detail, now)}`);
    this.drawn = true;
  }

  /** The line's text, without terminal control codes. */
  render(done: number, detail: string, now = performance.now()): string {
    const seconds = Math.max((now - this.started) / 1000, 1e-9);
    const rate = done / seconds;
    const parts = [`${this.label}: ${formatCount(done)} ${this.unit}`];
    if (this.total !== null && this.total > 0) {
      parts[0] += ` of ${formatCount(this.total)} (${((100 * done) / this.total).toFixed(1)} %)`;
    }
    parts.push(`${formatCount(rate)} ${this.unit}/s`);
    if (this.total !== null && rate > 0 && done < this.total) {
      parts.push(`${formatDuration((this.total - done) / rate)} left`);
    }
    if (detail !== "") parts.push(detail);
    return parts.join(", ");
  }

  /** Clears the line so the next output starts clean. */
  finish(): void {
    if (this.drawn) this.stream.write("\r\x1b[2K");
    this.drawn = false;
  }
}

/** 1234567 -> "1.23 M". */
export function formatCount(n: number): string {
  if (!Number.isFinite(n)) return String(n);
  const abs = Math.abs(n);
  if (abs >= 1e9) return `${(n / 1e9).toFixed(2)} G`;
  if (abs >= 1e6) return `${(n / 1e6).toFixed(2)} M`;
  if (abs >= 1e4) return `${(n / 1e3).toFixed(1)} k`;
  return Number.isInteger(n) ? String(n) : n.toFixed(1);
}

/** 3725 -> "1 h 02 min". */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds)) return "?";
  if (seconds < 60) return `${Math.ceil(seconds)} s`;
  const minutes = Math.floor(seconds / 60);
  if (minutes < 60) return `${minutes} min ${String(Math.floor(seconds % 60)).padStart(2, "0")} s`;
  return `${Math.floor(minutes / 60)} h ${String(minutes % 60).padStart(2, "0")} min`;
}
