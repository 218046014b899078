// The dataset schema the reader fuzz tests read against, and an oracle of its
// cell rules written from the documented rules (schemas/dataset.schema.json,
// openDataFile's doc comment), not from the readers' code.
import {
  resolveDatasetSchema,
  type ResolvedSchema,
} from "../../trainer/schema/load-dataset-schema.js";

/** Columns with every role the text readers check, and names that are also Object.prototype keys. */
export const fuzzSchema: ResolvedSchema = resolveDatasetSchema({
  name: "hostile-plots",
  missing: ["", "NA"],
  columns: [
    { name: "x", role: "numeric", missing: ["", "NA", "-999"] },
    { name: "crop", role: "categorical" },
    { name: "open", role: "outcome" },
    { name: "w", role: "weight", required: false },
    { name: "open_p", role: "true_probability", outcome: "open", required: false },
    { name: "constructor", role: "numeric", required: false },
    { name: "__proto__", role: "categorical", required: false },
    { name: "shown_at", role: "timestamp", timeUnit: "s", required: false },
    { name: "note", role: "ignore", required: false },
  ],
});

/** A decoded cell: a number (NaN when missing), a 0/1 label, or a category text (null when missing). */
export type CellValue = number | string | null;

/** What the oracle says about one cell: its value, or that it makes the row bad. */
export type CellVerdict = { ok: true; value: CellValue } | { ok: false };

const BAD: CellVerdict = { ok: false };
const ok = (value: CellValue): CellVerdict => ({ ok: true, value });

/** Label spellings besides numbers equal to 0 or 1 (the reader's documented list). */
const labelWords = new Map<string, number>([
  ["0", 0],
  ["1", 1],
  ["true", 1],
  ["false", 0],
  ["True", 1],
  ["False", 0],
  ["TRUE", 1],
  ["FALSE", 0],
]);

/**
 * The strict decimal grammar, hand-written: optional spaces or tabs around an
 * optional sign, digits with at most one dot (at least one digit), and an
 * optional exponent. Hex, words, NBSP and the like are not numbers. Returns
 * NaN when the text is not a number.
 */
export function oracleNumber(text: string): number {
  let from = 0;
  let to = text.length;
  while (from < to && (text[from] === " " || text[from] === "\t")) from++;
  while (to > from && (text[to - 1] === " " || text[to - 1] === "\t")) to--;
  const t = text.slice(from, to);
  let i = 0;
  if (t[i] === "+" || t[i] === "-") i++;
  const isDigit = (c: string | undefined): boolean => c !== undefined && c >= "0" && c <= "9";
  const start = i;
  while (isDigit(t[i])) i++;
  let digits = i - start;
  if (t[i] === ".") {
    const after = ++i;
    while (isDigit(t[i])) i++;
    digits += i - after;
  }
  if (digits === 0) return Number.NaN;
  if (t[i] === "e" || t[i] === "E") {
    i++;
    if (t[i] === "+" || t[i] === "-") i++;
    const exponentStart = i;
    while (isDigit(t[i])) i++;
    if (i === exponentStart) return Number.NaN;
  }
  return i === t.length ? Number(t) : Number.NaN;
}

/** The oracle for a cell given as text (a CSV field, a JSON string). */
export function textVerdict(column: string, text: string): CellVerdict {
  const spec = fuzzSchema.byName.get(column);
  if (spec === undefined) throw new Error(`not a fuzz column: ${column}`);
  if (spec.missing.has(text)) return missingVerdict(column);
  if (spec.role === "categorical") return ok(text);
  if (spec.role === "outcome") {
    const word = labelWords.get(text);
    if (word !== undefined) return ok(word);
  }
  return numberVerdict(column, oracleNumber(text));
}

/** The oracle for a cell given as a parsed JSON value (undefined: the key is absent). */
export function jsonVerdict(column: string, value: unknown): CellVerdict {
  const spec = fuzzSchema.byName.get(column);
  if (spec === undefined) throw new Error(`not a fuzz column: ${column}`);
  if (value === null || value === undefined) return missingVerdict(column);
  if (typeof value === "string") return textVerdict(column, value);
  if (typeof value === "boolean") {
    if (spec.role === "outcome") return ok(value ? 1 : 0);
    if (spec.role === "categorical") return ok(String(value));
    return BAD;
  }
  if (typeof value === "number") {
    // Missing markers that read as numbers match typed numbers (documented on numericMarkers).
    for (const marker of spec.missing) {
      const markerNumber = oracleNumber(marker);
      if (!Number.isNaN(markerNumber) && markerNumber === value) return missingVerdict(column);
    }
    if (spec.role === "categorical") return ok(String(value));
    return numberVerdict(column, value);
  }
  return BAD;
}

function missingVerdict(column: string): CellVerdict {
  const role = fuzzSchema.byName.get(column)?.role;
  if (role === "numeric") return ok(Number.NaN);
  if (role === "categorical") return ok(null);
  return BAD;
}

function numberVerdict(column: string, value: number): CellVerdict {
  if (!Number.isFinite(value)) return BAD;
  switch (fuzzSchema.byName.get(column)?.role) {
    case "numeric":
      return ok(value);
    case "outcome":
      return value === 0 || value === 1 ? ok(value === 0 ? 0 : 1) : BAD;
    case "weight":
      return value >= 0 ? ok(value) : BAD;
    case "true_probability":
      return value >= 0 && value <= 1 ? ok(value) : BAD;
    case "timestamp":
      return Number.isFinite(value * 1000) ? ok(value * 1000) : BAD;
    default:
      return BAD;
  }
}

/** The schema's non-ignored columns among `names`, in schema order (how readers order batch columns). */
export function readColumns(names: readonly string[]): string[] {
  const present = new Set(names);
  return fuzzSchema.columns
    .filter((c) => c.role !== "ignore" && present.has(c.name))
    .map((c) => c.name);
}

/** Whether the file's columns are refused: a required column absent, or a schema column named twice. */
export function columnsRefused(names: readonly string[]): boolean {
  const seen = new Set<string>();
  for (const name of names) {
    if (!fuzzSchema.byName.has(name)) continue;
    if (seen.has(name)) return true;
    seen.add(name);
  }
  return fuzzSchema.columns.some((c) => c.required && !seen.has(c.name));
}
