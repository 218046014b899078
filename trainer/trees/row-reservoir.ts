import type { ColumnBatch } from "../data/column-batch.js";
import type { CategoryDictionary } from "../data/category-dictionary.js";
import { LeafcastError } from "../errors.js";
import { SeededRandom } from "./seeded-random.js";

/** Which columns a reservoir keeps, by kind. */
export interface ReservoirColumns {
  readonly numbers: readonly string[];
  readonly categories: readonly string[];
  readonly labels: readonly string[];
}

/**
 * A uniform seeded sample of at most `capacity` rows from a stream of column
 * batches (reservoir sampling, Algorithm R: row i replaces a random kept row
 * with probability capacity / (i + 1)). Columns are typed arrays that grow by
 * doubling up to the capacity; rows never become objects.
 *
 * @example
 * const reservoir = new RowReservoir({ numbers: ["tie_strength"], categories: ["post_type"], labels: ["open"] }, 2_000_000, 1);
 * for await (const batch of reader.batches()) reservoir.add(batch);
 * reservoir.numbers("tie_strength"); // Float64Array of reservoir.size values
 */
export class RowReservoir {
  /** Rows offered so far. */
  seen = 0;
  private size_ = 0;
  private allocated = 0;
  private readonly random: SeededRandom;
  private readonly numberColumns = new Map<string, Float64Array>();
  private readonly categoryColumns = new Map<string, Int32Array>();
  private readonly labelColumns = new Map<string, Uint8Array>();
  private readonly dictionaries = new Map<string, CategoryDictionary>();
  private slots = new Int32Array(0);

  constructor(
    private readonly columns: ReservoirColumns,
    private readonly capacity: number,
    seed: number,
  ) {
    this.random = new SeededRandom(seed).fork(3);
  }

  /** Rows kept. */
  get size(): number {
    return this.size_;
  }

  /** Offers every row of a batch. */
  add(batch: ColumnBatch): void {
    const n = batch.rowCount;
    if (this.slots.length < n) this.slots = new Int32Array(n);
    const slots = this.slots;
    for (let i = 0; i < n; i++) {
      const seen = this.seen++;
      if (seen < this.capacity) slots[i] = seen;
      else {
        const j = this.random.nextInt(seen + 1);
        slots[i] = j < this.capacity ? j : -1;
      }
    }
    this.size_ = Math.min(this.seen, this.capacity);
    this.grow(this.size_);
    for (const name of this.columns.numbers) {
      copyInto(
        this.source(batch, name, "number"),
        this.numberColumns.get(name) as Float64Array,
        slots,
        n,
      );
    }
    for (const name of this.columns.labels) {
      copyInto(
        this.source(batch, name, "label"),
        this.labelColumns.get(name) as Uint8Array,
        slots,
        n,
      );
    }
    for (const name of this.columns.categories) {
      const column = batch.columns.get(name);
      if (column?.kind !== "category") throw missing(batch, name, "category");
      this.dictionaries.set(name, column.dictionary);
      copyInto(column.codes, this.categoryColumns.get(name) as Int32Array, slots, n);
    }
  }

  numbers(name: string): Float64Array {
    return (this.numberColumns.get(name) ?? new Float64Array(0)).subarray(0, this.size_);
  }

  labels(name: string): Uint8Array {
    return (this.labelColumns.get(name) ?? new Uint8Array(0)).subarray(0, this.size_);
  }

  codes(name: string): Int32Array {
    return (this.categoryColumns.get(name) ?? new Int32Array(0)).subarray(0, this.size_);
  }

  /** The category texts in code order (empty before any batch). */
  dictionary(name: string): readonly string[] {
    return this.dictionaries.get(name)?.list() ?? [];
  }

  private source(
    batch: ColumnBatch,
    name: string,
    kind: "number" | "label",
  ): Float64Array | Uint8Array {
    const column = batch.columns.get(name);
    if (column === undefined || column.kind !== kind) throw missing(batch, name, kind);
    return column.values;
  }

  private grow(rows: number): void {
    if (rows <= this.allocated) return;
    let next = Math.max(this.allocated, 1024);
    while (next < rows) next *= 2;
    next = Math.min(next, this.capacity);
    const resize = <T extends Float64Array | Int32Array | Uint8Array>(
      old: T | undefined,
      make: (n: number) => T,
    ): T => {
      const fresh = make(next);
      if (old !== undefined) fresh.set(old);
      return fresh;
    };
    for (const name of this.columns.numbers) {
      this.numberColumns.set(
        name,
        resize(this.numberColumns.get(name), (k) => new Float64Array(k)),
      );
    }
    for (const name of this.columns.labels) {
      this.labelColumns.set(
        name,
        resize(this.labelColumns.get(name), (k) => new Uint8Array(k)),
      );
    }
    for (const name of this.columns.categories) {
      this.categoryColumns.set(
        name,
        resize(this.categoryColumns.get(name), (k) => new Int32Array(k)),
      );
    }
    this.allocated = next;
  }
}

function copyInto<T extends Float64Array | Int32Array | Uint8Array>(
  from: T,
  to: T,
  slots: Int32Array,
  n: number,
): void {
  for (let i = 0; i < n; i++) {
    const slot = slots[i];
    if (slot >= 0) to[slot] = from[i];
  }
}

function missing(batch: ColumnBatch, name: string, kind: string): LeafcastError {
  return new LeafcastError("trees", [
    {
      code: "missing_column",
      message: `expected a ${kind} column "${name}", found ${batch.columns.get(name)?.kind ?? "none"}`,
      file: batch.file,
      column: name,
    },
  ]);
}
