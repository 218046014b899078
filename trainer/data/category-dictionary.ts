/**
 * Maps categorical texts to dense integer codes, growing as new values appear.
 * One dictionary serves every batch of a read, so a code means the same value
 * in all batches of that read.
 *
 * @example
 * const d = new CategoryDictionary();
 * d.codeOf("tip"); // 0
 * d.codeOf("swap"); // 1
 * d.codeOf("tip"); // 0
 * d.valueOf(1); // "swap"
 */
export class CategoryDictionary {
  private readonly codes = new Map<string, number>();
  private readonly values: string[] = [];

  /** The code of `value`, adding it when new. */
  codeOf(value: string): number {
    let code = this.codes.get(value);
    if (code === undefined) {
      code = this.values.length;
      this.codes.set(value, code);
      this.values.push(value);
    }
    return code;
  }

  /** The code of `value`, or -1 when it was never seen. */
  lookup(value: string): number {
    return this.codes.get(value) ?? -1;
  }

  /** The text behind `code`. */
  valueOf(code: number): string {
    const value = this.values[code];
    if (value === undefined) throw new RangeError(`category: no value has code ${code}`);
    return value;
  }

  get size(): number {
    return this.values.length;
  }

  /** All values in code order. */
  list(): readonly string[] {
    return this.values;
  }
}
