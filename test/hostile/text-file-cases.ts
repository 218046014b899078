import fc from "fast-check";
import { mutationArb, type Mutation } from "./byte-mutations.js";
import { cellTextArb, goodJson, goodTexts, jsonValueTextArb } from "./hostile-texts.js";

/** Header names: the fuzz schema's columns, one it does not list, and prototype keys. */
const optionalNames = [
  "w",
  "open_p",
  "constructor",
  "__proto__",
  "shown_at",
  "note",
  "extra",
  "toString",
];
const requiredNames = ["x", "crop", "open"];

/** A small valid-looking table: header names and rows of cell texts (some rows ragged). */
export interface TableCase {
  names: string[];
  rows: string[][];
  /** The same table's cells as JSON value texts, for NDJSON. */
  json: string[][];
}

/** One cell's draw: mostly a text its column accepts, else a hostile or random one. */
interface CellDraw {
  pick: number;
  good: number;
  other: string;
  otherJson: string;
}

function pickText(
  good: ReadonlyMap<string, readonly string[]>,
  column: string,
  cell: CellDraw,
  other: string,
): string {
  const list = good.get(column);
  return list !== undefined && cell.pick < 7 ? list[cell.good % list.length] : other;
}

const cellArb: fc.Arbitrary<CellDraw> = fc.record({
  pick: fc.integer({ min: 0, max: 9 }),
  good: fc.nat(),
  other: cellTextArb,
  otherJson: jsonValueTextArb,
});

export const tableArb: fc.Arbitrary<TableCase> = fc
  .tuple(
    fc.subarray(optionalNames),
    fc.boolean(),
    fc.integer({ min: 0, max: 0xffff }),
    fc.array(
      fc.tuple(
        fc.array(cellArb, { minLength: 12, maxLength: 12 }),
        fc.integer({ min: -8, max: 8 }),
      ),
      {
        maxLength: 10,
      },
    ),
  )
  .map(([optional, duplicate, order, rawRows]) => {
    const names = [...requiredNames, ...optional];
    if (duplicate && order % 7 === 0) names.push(names[order % names.length]);
    // A seeded shuffle, so the header order varies with the case and shrinks with it.
    for (let i = names.length - 1; i > 0; i--) {
      const j = (order * (i + 7)) % (i + 1);
      [names[i], names[j]] = [names[j], names[i]];
    }
    // Most rows fit the header; a delta of +-1 now and then makes a ragged row.
    const rows = rawRows.map(([cells, delta]) =>
      cells
        .slice(0, Math.max(1, names.length + (Math.abs(delta) === 1 ? delta : 0)))
        .map((cell, i) => pickText(goodTexts, names[i] ?? "extra", cell, cell.other)),
    );
    const json = rawRows.map(([cells]) =>
      cells.map((cell, i) => pickText(goodJson, names[i] ?? "extra", cell, cell.otherJson)),
    );
    return { names, rows, json };
  });

/** How a text file is laid out before damage, and the damage. */
export interface Layout {
  lineEnd: string;
  bom: boolean;
  trailingNewline: boolean;
  blankAfter: number;
  quoteMask: number;
  mutations: Mutation[];
}

export const layoutArb: fc.Arbitrary<Layout> = fc.record({
  lineEnd: fc.constantFrom("\n", "\r\n", "\r"),
  bom: fc.boolean(),
  trailingNewline: fc.boolean(),
  blankAfter: fc.integer({ min: -1, max: 12 }),
  quoteMask: fc.integer({ min: 0, max: 0xfff }),
  mutations: fc.oneof(
    { weight: 1, arbitrary: fc.constant<Mutation[]>([]) },
    { weight: 3, arbitrary: fc.array(mutationArb, { minLength: 1, maxLength: 3 }) },
  ),
});

/** Reader options that cut records across chunk boundaries and batches. */
export const readOptionsArb = fc.record({
  chunkBytes: fc.oneof(
    // One-byte reads are the sharpest test of cut records but cost a system call per byte: kept rare.
    { weight: 1, arbitrary: fc.constantFrom(1, 2, 3) },
    { weight: 6, arbitrary: fc.constantFrom(7, 16, 61, 4096) },
  ),
  batchRows: fc.integer({ min: 1, max: 5 }),
});

/** Writes a table as CSV text: fields quoted where they must be, and where the mask says. */
export function csvText(table: TableCase, layout: Layout): string {
  const field = (text: string, i: number): string =>
    /[",\r\n]/.test(text) || (layout.quoteMask >> i) & 1 ? `"${text.replaceAll('"', '""')}"` : text;
  const lines = [table.names, ...table.rows].map((cells) => cells.map(field).join(","));
  if (layout.blankAfter >= 0 && layout.blankAfter < lines.length)
    lines.splice(layout.blankAfter + 1, 0, "");
  return (
    (layout.bom ? "\ufeff" : "") +
    lines.join(layout.lineEnd) +
    (layout.trailingNewline ? layout.lineEnd : "")
  );
}

/** An NDJSON file: per row, the keys present (a cell text of the row decides) and their value texts. */
export function ndjsonText(table: TableCase, layout: Layout): string {
  const values = table.json;
  const lines = table.rows.map((cells, r) => {
    const parts: string[] = [];
    table.names.forEach((name, i) => {
      // A row leaves a key out when its cell text happens to be "NA" (a missing cell in NDJSON terms).
      if (cells[i] === "NA") return;
      parts.push(`${JSON.stringify(name)}:${values[r]?.[i] ?? "null"}`);
    });
    // Where the CSV row would be ragged, the NDJSON line is not an object at all.
    if (cells.length !== table.names.length) return ["[1,2]", "3", "null", '"text"'][r % 4];
    return `{${parts.join(",")}}`;
  });
  if (layout.blankAfter >= 0 && layout.blankAfter < lines.length)
    lines.splice(layout.blankAfter, 0, "  ");
  const lineEnd = layout.lineEnd === "\r" ? "\n" : layout.lineEnd;
  return (
    (layout.bom ? "\ufeff" : "") + lines.join(lineEnd) + (layout.trailingNewline ? lineEnd : "")
  );
}
