/** The most bytes of values held (16 MiB); Int32 offsets into the pool stay far from overflow. */
const MAX_POOL_BYTES = 1 << 24;

/**
 * Remembers the codes of category values by their UTF-8 bytes, so the CSV
 * kernel can code a repeated value straight from the read buffer without
 * making a string and hashing it again in a Map. It holds only values already
 * in the column's dictionary, at most `maxEntries` of them (default 65,536) and
 * at most 16 MiB of their bytes: values beyond that simply miss, and take the
 * text path.
 *
 * @example
 * const cache = new CategoryByteCache();
 * const hash = CategoryByteCache.hash(buf, start, end);
 * let code = cache.find(buf, start, end, hash); // -1 on a miss
 * if (code < 0) cache.add(buf, start, end, hash, (code = dictionary.codeOf(text)));
 */
export class CategoryByteCache {
  private table: Int32Array = new Int32Array(32);
  private mask = 31;
  private hashes: Int32Array = new Int32Array(16);
  private starts: Int32Array = new Int32Array(16);
  private lengths: Int32Array = new Int32Array(16);
  private codes: Int32Array = new Int32Array(16);
  private pool: Uint8Array = new Uint8Array(256);
  private poolUsed = 0;
  private count = 0;

  /** The table starts small and doubles with the entries (load at most 1/2): a read of a small file should not pay for 65,536 slots. */
  constructor(private readonly maxEntries = 1 << 16) {}

  /** FNV-1a over bytes [start, end), the hash `find` and `add` expect (kernels may compute it while scanning). */
  static hash(buf: Uint8Array, start: number, end: number): number {
    let h = 0x811c9dc5 | 0;
    for (let i = start; i < end; i++) h = Math.imul(h ^ buf[i], 16777619);
    return h;
  }

  /** The code of the value whose bytes are `buf[start, end)`, or -1 when it is not cached. */
  find(buf: Uint8Array, start: number, end: number, hash: number): number {
    const length = end - start;
    let at = hash & this.mask;
    let entry: number;
    while ((entry = this.table[at]) !== 0) {
      const e = entry - 1;
      if (this.hashes[e] === hash && this.lengths[e] === length) {
        const pool = this.pool;
        const from = this.starts[e];
        let i = 0;
        while (i < length && pool[from + i] === buf[start + i]) i++;
        if (i === length) return this.codes[e];
      }
      at = (at + 1) & this.mask;
    }
    return -1;
  }

  /** Caches `code` for the value whose bytes are `buf[start, end)`; ignored when the cache is full. */
  add(buf: Uint8Array, start: number, end: number, hash: number, code: number): void {
    if (this.count >= this.maxEntries) return;
    const length = end - start;
    // The entry count alone does not bound memory: 65,536 values of a megabyte each would.
    if (this.poolUsed + length > MAX_POOL_BYTES) return;
    const e = this.count;
    if (e === this.hashes.length) this.growEntries();
    while (this.poolUsed + length > this.pool.length) {
      const pool = new Uint8Array(this.pool.length * 2);
      pool.set(this.pool);
      this.pool = pool;
    }
    this.pool.set(buf.subarray(start, end), this.poolUsed);
    this.hashes[e] = hash;
    this.starts[e] = this.poolUsed;
    this.lengths[e] = length;
    this.codes[e] = code;
    this.poolUsed += length;
    this.count = e + 1;
    if (this.count * 2 > this.table.length) this.growTable();
    else this.place(e);
  }

  /** Puts entry `e` in its first free slot from its hash. */
  private place(e: number): void {
    let at = this.hashes[e] & this.mask;
    while (this.table[at] !== 0) at = (at + 1) & this.mask;
    this.table[at] = e + 1;
  }

  private growTable(): void {
    this.table = new Int32Array(this.table.length * 2);
    this.mask = this.table.length - 1;
    for (let e = 0; e < this.count; e++) this.place(e);
  }

  private growEntries(): void {
    const grow = (a: Int32Array): Int32Array => {
      const b = new Int32Array(a.length * 2);
      b.set(a);
      return b;
    };
    this.hashes = grow(this.hashes);
    this.starts = grow(this.starts);
    this.lengths = grow(this.lengths);
    this.codes = grow(this.codes);
  }
}
