import type { ColumnarBatch, ColumnInput } from "./columnar-batch.js";
import type { ScoreItem } from "./score-item.js";
import { ScorerError } from "./scorer-error.js";

/**
 * Turns a list of items into a columnar batch for the given features: a
 * Float64Array per numeric feature, codes and a dictionary per categorical
 * feature. Values are read as scoreOne reads them.
 *
 * @example
 * const batch = columnsFromItems(scorer.features, items);
 * scorer.scoreBatch(batch).combined;
 */
export function columnsFromItems(
  features: { readonly numeric: readonly string[]; readonly categorical: readonly string[] },
  items: readonly ScoreItem[],
): ColumnarBatch {
  const columns = new Map<string, ColumnInput>();
  const read = (item: ScoreItem, name: string): unknown =>
    Object.prototype.hasOwnProperty.call(item, name) ? item[name] : undefined;
  for (const name of features.numeric) {
    const values = new Float64Array(items.length);
    items.forEach((item, i) => {
      const value = read(item, name);
      if (typeof value === "number") values[i] = value;
      else if (value === null || value === undefined) values[i] = NaN;
      else throw wrongType(name, i, "a number or null", value);
    });
    columns.set(name, { kind: "number", values });
  }
  for (const name of features.categorical) {
    const codes = new Int32Array(items.length);
    const codeOf = new Map<string, number>();
    const list: string[] = [];
    items.forEach((item, i) => {
      const value = read(item, name);
      let text: string | null;
      if (typeof value === "string") text = value;
      else if (typeof value === "number") text = Number.isFinite(value) ? String(value) : null;
      else if (value === null || value === undefined) text = null;
      else throw wrongType(name, i, "a string or null", value);
      if (text === null) {
        codes[i] = -1;
        return;
      }
      let code = codeOf.get(text);
      if (code === undefined) {
        code = list.length;
        codeOf.set(text, code);
        list.push(text);
      }
      codes[i] = code;
    });
    columns.set(name, { kind: "category", codes, dictionary: { list: () => list } });
  }
  return { rowCount: items.length, columns };
}

function wrongType(name: string, row: number, expected: string, value: unknown): ScorerError {
  return new ScorerError("item", [
    {
      code: "wrong_type",
      path: `/${row}/${name}`,
      message: `feature "${name}" expected ${expected}, found ${typeof value} (item ${row})`,
    },
  ]);
}
