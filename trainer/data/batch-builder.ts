import type { CategoryDictionary } from "./category-dictionary.js";
import type { ColumnBatch, ColumnData } from "./column-batch.js";
import { LABEL_WORDS, expectation, numberProblem, numericMarkers } from "./cell-problems.js";
import { describeValue } from "./describe-value.js";
import { isNonFiniteText, parseNumberText } from "./parse-number-text.js";
import { parseIsoTime } from "./parse-iso-time.js";
import * as C from "./plan-columns.js";
import type { ColumnSlot } from "./plan-columns.js";
import type { RejectSink } from "./reject-sink.js";

/**
 * Builds one batch at a time from cells that readers hand over row by row,
 * checking each cell by its column's role and writing it straight into typed
 * arrays at the current row. A row's cells land in place; `commitRow` advances
 * to the next row, `rejectRow` hands the row to the bad-row policy and lets the
 * next row overwrite it. Category texts wait for the commit, so a rejected row
 * never adds a value to a dictionary.
 *
 * @example
 * const b = new BatchBuilder("plots.csv", slots, 65536, sink);
 * b.textCell(0, "0.75"); b.textCell(1, "1");
 * if (b.rowBad) b.rejectRow(1, "0.75,1"); else b.commitRow();
 * const batch = b.take(); // batch.rowCount === 1
 */
export class BatchBuilder {
  /** Rows committed to the batch being built. */
  rowCount = 0;
  /** Whether a cell of the current row failed; its first problem is kept. */
  rowBad = false;
  /** 1 where a missing marker reads as a number, so a reader's numeric fast path must defer to `textCell`. */
  readonly numericMarker: Uint8Array;
  private readonly cells: Uint8Array;
  private readonly allowMissing: Uint8Array;
  private readonly missingTexts: ReadonlySet<string>[];
  private readonly missingNumbers: (ReadonlySet<number> | null)[];
  private readonly categorySlots: number[];
  private readonly pendingText: string[];
  /** Per category slot for the current row: a known code, -1 for missing, or -2 when `pendingText` is to be coded at commit. */
  private readonly pendingCode: Int32Array;
  /** Per slot, the number column being filled (empty for label and category slots); kernels may write row `rowCount` directly. Replaced by `take()`. */
  numbers: Float64Array[] = [];
  /** Per slot, the label column being filled (empty for others); see `numbers`. */
  labels: Uint8Array[] = [];
  /** Per slot, the category codes being filled (empty for others); see `numbers`. */
  codes: Int32Array[] = [];
  private errorSlot = -1;
  private errorCode = "";
  private errorFound = "";
  private errorMessage: string | null = null;
  private errorColumn: string | null = null;

  constructor(
    readonly file: string,
    readonly slots: readonly ColumnSlot[],
    readonly capacity: number,
    private readonly sink: RejectSink,
  ) {
    const n = slots.length;
    this.cells = Uint8Array.from(slots, (s) => s.cell);
    this.allowMissing = Uint8Array.from(slots, (s) => (s.column.allowMissing ? 1 : 0));
    this.missingTexts = slots.map((s) => s.column.missing);
    this.missingNumbers = slots.map((s) => numericMarkers(s.column.missing));
    this.numericMarker = Uint8Array.from(this.missingNumbers, (m) => (m === null ? 0 : 1));
    this.categorySlots = slots.flatMap((s, i) => (s.cell === C.CELL_CATEGORY ? [i] : []));
    this.pendingText = new Array<string>(n).fill("");
    this.pendingCode = new Int32Array(n).fill(-1);
    this.allocate();
  }

  get full(): boolean {
    return this.rowCount === this.capacity;
  }

  /**
   * Writes a number if the column's role accepts it; returns false (recording
   * nothing) if not, so a reader can retry with the cell's text for the message.
   */
  tryNumber(slot: number, value: number): boolean {
    const row = this.rowCount;
    switch (this.cells[slot]) {
      case C.CELL_NUMBER:
      case C.CELL_TIME_MS:
        if (value - value !== 0) return false;
        this.numbers[slot][row] = value;
        return true;
      case C.CELL_WEIGHT:
        if (!(value >= 0 && value < Infinity)) return false;
        this.numbers[slot][row] = value;
        return true;
      case C.CELL_PROBABILITY:
        if (!(value >= 0 && value <= 1)) return false;
        this.numbers[slot][row] = value;
        return true;
      case C.CELL_LABEL:
        if (value !== 0 && value !== 1) return false;
        this.labels[slot][row] = value;
        return true;
      case C.CELL_TIME_S: {
        const ms = value * 1000; // may overflow to Infinity
        if (ms - ms !== 0) return false;
        this.numbers[slot][row] = ms;
        return true;
      }
      case C.CELL_CATEGORY:
        this.categoryText(slot, String(value));
        return true;
      default:
        return false;
    }
  }

  /** A number from a typed source; `found` describes it in a message (default: the number). */
  numberCell(slot: number, value: number, found?: string): void {
    const markers = this.missingNumbers[slot];
    if (markers !== null && markers.has(value)) {
      this.missingCell(slot, found ?? String(value));
    } else if (!this.tryNumber(slot, value)) {
      this.fail(slot, numberProblem(this.cells[slot], value), found ?? String(value));
    }
  }

  /** A cell's text (CSV field, JSON string, Parquet/Arrow string). */
  textCell(slot: number, text: string): void {
    if (this.missingTexts[slot].has(text)) {
      this.missingCell(slot, text);
      return;
    }
    const cell = this.cells[slot];
    if (cell === C.CELL_CATEGORY) {
      this.categoryText(slot, text);
    } else if (cell === C.CELL_TIME_ISO) {
      const ms = parseIsoTime(text);
      if (Number.isNaN(ms)) this.fail(slot, "bad_time", JSON.stringify(text));
      else this.numbers[slot][this.rowCount] = ms;
    } else if (cell === C.CELL_LABEL && LABEL_WORDS.has(text)) {
      this.labels[slot][this.rowCount] = LABEL_WORDS.get(text) ?? 0;
    } else {
      const value = parseNumberText(text);
      if (Number.isNaN(value) || value - value !== 0) {
        const code =
          cell === C.CELL_LABEL
            ? "not_a_label"
            : isNonFiniteText(text)
              ? "not_finite"
              : "not_a_number";
        this.fail(slot, code, describeValue(text));
      } else if (!this.tryNumber(slot, value)) {
        this.fail(slot, numberProblem(this.cells[slot], value), describeValue(text));
      }
    }
  }

  /** A cell whose bytes are not UTF-8 (`text` is their lossy decoding, for the message). */
  invalidText(slot: number, text: string): void {
    this.fail(slot, "invalid_utf8", describeValue(text));
  }

  /** A value from JSON, Parquet or Arrow, whatever its type. */
  valueCell(slot: number, value: unknown): void {
    switch (typeof value) {
      case "number":
        this.numberCell(slot, value);
        return;
      case "string":
        this.textCell(slot, value);
        return;
      case "bigint":
        if (this.cells[slot] === C.CELL_CATEGORY) this.categoryText(slot, String(value));
        else this.numberCell(slot, Number(value), String(value));
        return;
      case "boolean":
        if (this.cells[slot] === C.CELL_LABEL) this.labels[slot][this.rowCount] = value ? 1 : 0;
        else if (this.cells[slot] === C.CELL_CATEGORY) this.categoryText(slot, String(value));
        else this.fail(slot, "wrong_type", String(value));
        return;
      case "undefined":
        this.missingCell(slot, "null");
        return;
      default:
        if (value === null) this.missingCell(slot, "null");
        else if (value instanceof Date) this.timeCell(slot, value.getTime(), value);
        else this.fail(slot, "wrong_type", describeValue(value));
    }
  }

  /** An instant already in epoch milliseconds (a Parquet or Arrow timestamp), whatever the time unit. */
  timeCell(slot: number, ms: number, found: unknown): void {
    const cell = this.cells[slot];
    const isTime = cell === C.CELL_TIME_S || cell === C.CELL_TIME_MS || cell === C.CELL_TIME_ISO;
    if (!isTime) this.fail(slot, "wrong_type", describeValue(found));
    else if (ms - ms !== 0) this.fail(slot, "bad_time", describeValue(found));
    else this.numbers[slot][this.rowCount] = ms;
  }

  /** A category value whose code is already known (a kernel's cache hit); the value must not be a missing marker. */
  categoryCode(slot: number, code: number): void {
    this.pendingCode[slot] = code;
  }

  /** Whether `text` is a missing marker of the slot's column. */
  isMissingText(slot: number, text: string): boolean {
    return this.missingTexts[slot].has(text);
  }

  /** A missing cell: NaN or code -1 where the column allows it, else a problem. */
  missingCell(slot: number, found: string): void {
    const cell = this.cells[slot];
    if (this.allowMissing[slot] === 0 || cell === C.CELL_LABEL) {
      this.fail(
        slot,
        "missing_value",
        found === "null" ? "null" : `the missing marker ${JSON.stringify(found)}`,
      );
    } else if (cell === C.CELL_CATEGORY) {
      this.pendingCode[slot] = -1;
    } else {
      this.numbers[slot][this.rowCount] = Number.NaN;
    }
  }

  /** Marks the row bad for a reason of the row itself (ragged, bad quote, invalid JSON); wins over cell problems, not over an earlier row problem. */
  failRow(code: string, message: string, column: string | null): void {
    if (this.rowBad && this.errorMessage !== null) return;
    this.rowBad = true;
    this.errorCode = code;
    this.errorMessage = message;
    this.errorColumn = column;
  }

  /** Forgets a half-read row (a reader met the end of its buffer mid-row). */
  resetRow(): void {
    this.rowBad = false;
    this.errorMessage = null;
  }

  /**
   * Counts `count` rows that a kernel wrote straight into `numbers`, `labels`
   * and `codes` (already checked, categories already coded) as committed.
   */
  commitWritten(count: number): void {
    this.rowCount += count;
  }

  commitRow(): void {
    const row = this.rowCount;
    for (const slot of this.categorySlots) {
      const code = this.pendingCode[slot];
      this.codes[slot][row] =
        code !== -2
          ? code
          : (this.slots[slot].dictionary as CategoryDictionary).codeOf(this.pendingText[slot]);
    }
    this.rowCount = row + 1;
  }

  /** Hands the current (bad) row to the bad-row policy; throws under "fail". */
  rejectRow(row: number, raw: string): void {
    let column = this.errorColumn;
    let reason = this.errorMessage;
    if (reason === null) {
      const slot = this.slots[this.errorSlot];
      column = slot.name;
      reason = `column "${slot.name}" ${expectation(this.errorCode, slot.cell)}, found ${this.errorFound}`;
    }
    this.resetRow();
    this.sink.reject(row, column, this.errorCode, reason, raw);
  }

  /** The rows built so far as a batch; the builder starts a new one unless this is the `last` take of the read. */
  take(last = false): ColumnBatch {
    const n = this.rowCount;
    // A short last batch is copied so the full-size arrays can be freed.
    const cut = <T extends Float64Array | Uint8Array | Int32Array>(a: T): T =>
      (n === this.capacity ? a : a.slice(0, n)) as T;
    const columns = new Map<string, ColumnData>();
    this.slots.forEach((slot, i) => {
      if (slot.cell === C.CELL_LABEL)
        columns.set(slot.name, { kind: "label", values: cut(this.labels[i]) });
      else if (slot.cell === C.CELL_CATEGORY) {
        const dictionary = slot.dictionary as CategoryDictionary;
        columns.set(slot.name, { kind: "category", codes: cut(this.codes[i]), dictionary });
      } else columns.set(slot.name, { kind: "number", values: cut(this.numbers[i]) });
    });
    this.rowCount = 0;
    if (!last) this.allocate();
    return { file: this.file, rowCount: n, columns };
  }

  private categoryText(slot: number, text: string): void {
    this.pendingText[slot] = text;
    this.pendingCode[slot] = -2;
  }

  private fail(slot: number, code: string, found: string): void {
    if (this.rowBad) return;
    this.rowBad = true;
    this.errorSlot = slot;
    this.errorCode = code;
    this.errorFound = found;
    this.errorMessage = null;
    this.errorColumn = null;
  }

  private allocate(): void {
    const size = this.capacity;
    const none8 = new Uint8Array(0);
    const none32 = new Int32Array(0);
    const none64 = new Float64Array(0);
    const cells = this.slots.map((s) => s.cell);
    this.numbers = cells.map((c) =>
      c !== C.CELL_LABEL && c !== C.CELL_CATEGORY ? new Float64Array(size) : none64,
    );
    this.labels = cells.map((c) => (c === C.CELL_LABEL ? new Uint8Array(size) : none8));
    this.codes = cells.map((c) => (c === C.CELL_CATEGORY ? new Int32Array(size) : none32));
  }
}
