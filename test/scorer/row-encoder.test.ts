import { describe, expect, it } from "vitest";
import type { ColumnarBatch, ColumnInput } from "../../scorer/columnar-batch.js";
import { columnsFromItems } from "../../scorer/columns-from-items.js";
import { RowEncoder } from "../../scorer/row-encoder.js";
import type { EncodedBatch } from "../../scorer/model-types.js";
import { ScorerError } from "../../scorer/scorer-error.js";
import { syntheticItems } from "../../trainer/artifact/synthetic-items.js";
import { mixedItems, mixedModel, smallModel } from "./fixtures.js";
import { referenceEncode } from "./reference-model.js";

function rows(encoded: EncodedBatch): { index: number[]; value: number[] | null }[] {
  return Array.from({ length: encoded.rowCount }, (_, r) => {
    const [from, to] = [encoded.offsets[r], encoded.offsets[r + 1]];
    return {
      index: Array.from(encoded.index.subarray(from, to)),
      value: encoded.value === null ? null : Array.from(encoded.value.subarray(from, to)),
    };
  });
}

describe("RowEncoder", () => {
  const model = mixedModel();
  const items = mixedItems(300);
  const encoder = new RowEncoder(model);

  it("encodes exactly the reference entries: leaves, sorted hashed buckets, standardized numerics", () => {
    const fromItems = rows(encoder.encodeItems(items));
    const fromBatch = rows(
      encoder.encode(
        columnsFromItems(
          {
            numeric: model.contract.numeric,
            categorical: model.contract.categorical.map((c) => c.name),
          },
          items,
        ),
      ),
    );
    items.forEach((item, i) => {
      const reference = referenceEncode(model, item);
      expect(fromItems[i].index).toEqual(reference.index);
      // Values are computed by the same formula, so exactly equal.
      expect(fromItems[i].value).toEqual(reference.value);
      expect(fromBatch[i]).toEqual(fromItems[i]);
      for (let k = 1; k < reference.index.length; k++)
        expect(reference.index[k]).toBeGreaterThanOrEqual(reference.index[k - 1]);
    });
    expect(encoder.maxEntriesPerRow).toBe(33 + 4 + 2);
  });

  it("writes into preallocated buffers and refuses buffers that are too small", () => {
    const buffers = encoder.allocate(items.length);
    const first = encoder.encodeItems(items, buffers);
    expect(first.index).toBe(buffers.index);
    const again = encoder.encodeItems(items.slice(0, 10), buffers);
    expect(again.rowCount).toBe(10);
    expect(again.offsets[10]).toBe(first.offsets[10]);
    expect(() => encoder.encodeItems(items, encoder.allocate(5))).toThrow(ScorerError);
  });

  it("leaves value null when no numerics are standardized", () => {
    const plain = smallModel();
    const bare = new RowEncoder({ ...plain, encoding: { ...plain.encoding, numeric: [] } });
    const encoded = bare.encodeItems(syntheticItems(5));
    expect(encoded.value).toBeNull();
    expect(encoded.offsets[5]).toBeGreaterThanOrEqual(5 * 20);
  });

  it("keeps its per-code caches right while a dictionary grows between batches", () => {
    const names = {
      numeric: model.contract.numeric,
      categorical: model.contract.categorical.map((c) => c.name),
    };
    const whole = columnsFromItems(names, items);
    // Split the batch in two that share one growing dictionary per column, as a file reader does.
    const lists = new Map<string, string[]>();
    const half = (from: number, to: number): ColumnarBatch => {
      const columns = new Map<string, ColumnInput>();
      for (const [name, column] of whole.columns) {
        if (column.kind === "number") {
          columns.set(name, {
            kind: "number",
            values: (column.values as Float64Array).slice(from, to),
          });
        } else {
          const list = lists.get(name) ?? [];
          lists.set(name, list);
          const texts = column.dictionary!.list();
          const codes = Int32Array.from(column.codes!.slice(from, to), (code) => {
            if (code < 0) return -1;
            let at = list.indexOf(texts[code]);
            if (at < 0) at = list.push(texts[code]) - 1;
            return at;
          });
          columns.set(name, { kind: "category", codes, dictionary: { list: () => list } });
        }
      }
      return { rowCount: to - from, columns };
    };
    const cached = new RowEncoder(model);
    const a = rows(cached.encode(half(0, 150)));
    const b = rows(cached.encode(half(150, 300)));
    expect([...a, ...b]).toEqual(rows(encoder.encode(whole)));
  });

  it("refuses missing columns, wrong kinds and codes past the dictionary", () => {
    const names = {
      numeric: model.contract.numeric,
      categorical: model.contract.categorical.map((c) => c.name),
    };
    const batch = columnsFromItems(names, items.slice(0, 4));
    const columns = new Map(batch.columns);
    columns.delete("tie_strength");
    columns.set("season", { kind: "number", values: new Float64Array(4) });
    try {
      encoder.encode({ rowCount: 4, columns });
      throw new Error("expected a refusal");
    } catch (error) {
      expect(error).toBeInstanceOf(ScorerError);
      expect((error as ScorerError).message).toBe(
        'batch: /tie_strength: expected a column "tie_strength", found none\nbatch: /season: column "season" expected category codes with a dictionary, found kind "number"',
      );
    }
    const bad = new Map(batch.columns);
    bad.set("soil", {
      kind: "category",
      codes: Int32Array.of(0, 1, 99, 0),
      dictionary: { list: () => ["clay", "loam"] },
    });
    expect(() => encoder.encode({ rowCount: 4, columns: bad })).toThrow(
      /column "soil" expected a code below its dictionary size 2, found 99 \(row 2\)/,
    );
  });
});
