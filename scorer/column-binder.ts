import type { ColumnarBatch } from "./columnar-batch.js";
import type { InputPlan } from "./compile-inputs.js";
import { fillHashedSlots, NOT_YET } from "./fill-hashed-slots.js";
import { fillVirtualSlots } from "./fill-virtual-slots.js";
import { ScorerError, type ScorerIssue } from "./scorer-error.js";

/** A batch's columns resolved to the plan's features. */
export interface BoundBatch {
  readonly rowCount: number;
  /** Per numeric feature. */
  readonly numeric: readonly Float64Array[];
  /** Per categorical feature: codes, the dictionary's texts, code to tree code (-2: not looked up yet), code to hashed bucket (-2: not hashed yet). */
  readonly codes: readonly Int32Array[];
  readonly texts: readonly (readonly string[])[];
  readonly treeCode: readonly Int32Array[];
  readonly bucket: readonly Int32Array[];
  /** Per cross of two features with few value pairs: pair (a * bSize + b) to bucket (-2: not hashed yet); else null. */
  readonly crossBucket: readonly (Int32Array | null)[];
}

/** Crosses of two features get a per-pair table while the pairs number at most this. */
const MAX_CROSS_PAIRS = 1 << 20;

interface CrossCache {
  lists: readonly (readonly string[])[];
  table: Int32Array;
}

interface CodeCache {
  list: readonly string[];
  treeCode: Int32Array;
  bucket: Int32Array;
}

/**
 * Binds columnar batches to a scorer's features and fills row blocks from them.
 * Per-code work (the tree code of a text, the hash bucket of a hashed value or of
 * a two-feature cross's pair) is done once per distinct code and kept while the
 * dictionaries stay the same, so a batch costs hashing only for values it is the
 * first to use.
 *
 * @example
 * const binder = new ColumnBinder(plan);
 * const bound = binder.bind(batch);
 * binder.fill(bound, 0, 256, block, codes, hashedSlots, parts);
 */
export class ColumnBinder {
  private readonly plan: InputPlan;
  private readonly caches: (CodeCache | null)[];
  private readonly crossCaches: (CrossCache | null)[];

  constructor(plan: InputPlan) {
    this.plan = plan;
    this.caches = plan.categoricalNames.map(() => null);
    this.crossCaches = plan.crossFeatures.map(() => null);
  }

  /** Checks that every feature has a column of the right kind and length; throws a ScorerError listing every problem. */
  bind(batch: ColumnarBatch): BoundBatch {
    const plan = this.plan;
    const issues: ScorerIssue[] = [];
    const rowCount = batch.rowCount;
    if (!Number.isInteger(rowCount) || rowCount < 0) {
      throw new ScorerError("batch", [
        {
          code: "row_count",
          path: "/rowCount",
          message: `expected a row count >= 0, found ${rowCount}`,
        },
      ]);
    }
    const numeric = plan.numericNames.map((name) => {
      const column = batch.columns.get(name);
      const values = column?.values;
      if (column === undefined) issues.push(missingColumn(name));
      else if (column.kind !== "number" || !(values instanceof Float64Array)) {
        issues.push({
          code: "column_kind",
          path: `/${name}`,
          message: `column "${name}" expected numbers in a Float64Array, found kind "${column.kind}"`,
        });
      } else if (values.length < rowCount) {
        issues.push(shortColumn(name, rowCount, values.length));
      } else return values;
      return new Float64Array(0);
    });
    const codes: Int32Array[] = [];
    const texts: (readonly string[])[] = [];
    const treeCode: Int32Array[] = [];
    const bucket: Int32Array[] = [];
    plan.categoricalNames.forEach((name, c) => {
      const column = batch.columns.get(name);
      const list = column?.dictionary?.list();
      if (column === undefined) issues.push(missingColumn(name));
      else if (
        column.kind !== "category" ||
        !(column.codes instanceof Int32Array) ||
        !Array.isArray(list)
      ) {
        issues.push({
          code: "column_kind",
          path: `/${name}`,
          message: `column "${name}" expected category codes with a dictionary, found kind "${column.kind}"`,
        });
      } else if (column.codes.length < rowCount) {
        issues.push(shortColumn(name, rowCount, column.codes.length));
      } else {
        const cache = this.cacheFor(c, list);
        codes.push(column.codes);
        texts.push(list);
        treeCode.push(cache.treeCode);
        bucket.push(cache.bucket);
        return;
      }
      codes.push(new Int32Array(0));
      texts.push([]);
      treeCode.push(new Int32Array(0));
      bucket.push(new Int32Array(0));
    });
    if (issues.length > 0) throw new ScorerError("batch", issues);
    const crossBucket = plan.crossFeatures.map((features, x) =>
      this.crossCacheFor(x, features, texts),
    );
    return { rowCount, numeric, codes, texts, treeCode, bucket, crossBucket };
  }

  /** The pair table of a two-feature cross, kept while both dictionaries stay as they are. */
  private crossCacheFor(
    x: number,
    features: Int32Array,
    texts: readonly (readonly string[])[],
  ): Int32Array | null {
    if (features.length !== 2) return null;
    const lists = [texts[features[0]], texts[features[1]]];
    if (lists[0].length * lists[1].length > MAX_CROSS_PAIRS) return null;
    const cache = this.crossCaches[x];
    // The table is indexed by the second dictionary's size, so any change rebuilds it.
    if (
      cache !== null &&
      cache.lists.every((list, k) => list === lists[k]) &&
      cache.table.length === lists[0].length * lists[1].length
    ) {
      return cache.table;
    }
    const table = new Int32Array(lists[0].length * lists[1].length).fill(NOT_YET);
    this.crossCaches[x] = { lists, table };
    return table;
  }

  private cacheFor(c: number, list: readonly string[]): CodeCache {
    let cache = this.caches[c];
    if (cache === null || cache.list !== list) {
      cache = { list, treeCode: new Int32Array(0), bucket: new Int32Array(0) };
      this.caches[c] = cache;
    }
    if (cache.treeCode.length < list.length) {
      cache.treeCode = grow(cache.treeCode, list.length);
      cache.bucket = grow(cache.bucket, list.length);
    }
    return cache;
  }

  /**
   * Fills rows [start, start + count) of a bound batch into rows 0.. of the row
   * blocks and the hashed-slot block (see InputPlan). Allocates nothing.
   * `withHashing` false leaves the hashed slots alone (trees only).
   */
  fill(
    bound: BoundBatch,
    start: number,
    count: number,
    block: Float64Array,
    codeBlock: Int32Array,
    hashedSlots: Int32Array,
    parts: string[],
    withHashing = true,
  ): void {
    const plan = this.plan;
    const F = plan.featureCount;
    const stride = plan.stride;
    const numericCount = plan.numericNames.length;
    for (let f = 0; f < numericCount; f++) {
      const values = bound.numeric[f];
      for (let i = 0, r = f; i < count; i++, r += stride) {
        const v = values[start + i];
        if (v === v) {
          block[r] = v;
          block[r + F] = v;
        } else {
          block[r] = -Infinity;
          block[r + F] = Infinity;
        }
      }
    }
    for (let c = 0; c < plan.categoricalNames.length; c++) {
      const f = numericCount + c;
      const codes = bound.codes[c];
      const treeCode = bound.treeCode[c];
      const oneHot = plan.oneHot[c] === 1;
      for (let i = 0, r = f; i < count; i++, r += stride) {
        const code = checkedCode(
          codes[start + i],
          bound.texts[c].length,
          plan.categoricalNames[c],
          start + i,
        );
        let tc = -1;
        if (code >= 0) {
          tc = treeCode[code];
          if (tc === NOT_YET) tc = treeCode[code] = plan.codeOf[c].get(bound.texts[c][code]) ?? -1;
        }
        codeBlock[r] = oneHot ? 1 << (tc + 1) : 0;
        codeBlock[r + F] = tc + 1;
      }
    }
    fillVirtualSlots(plan, codeBlock, block, 0, count);
    if (withHashing) fillHashedSlots(plan, bound, start, count, hashedSlots, parts);
  }
}

function grow(old: Int32Array, length: number): Int32Array {
  const next = new Int32Array(Math.max(length, 2 * old.length)).fill(NOT_YET);
  next.set(old);
  return next;
}

function checkedCode(code: number, listLength: number, name: string, row: number): number {
  if (code < listLength) return code < 0 ? -1 : code;
  throw new ScorerError("batch", [
    {
      code: "unknown_code",
      path: `/${name}/${row}`,
      message: `column "${name}" expected a code below its dictionary size ${listLength}, found ${code} (row ${row})`,
    },
  ]);
}

function missingColumn(name: string): ScorerIssue {
  return {
    code: "missing_column",
    path: `/${name}`,
    message: `expected a column "${name}", found none`,
  };
}

function shortColumn(name: string, rowCount: number, length: number): ScorerIssue {
  return {
    code: "short_column",
    path: `/${name}`,
    message: `column "${name}" expected ${rowCount} rows, found ${length}`,
  };
}
