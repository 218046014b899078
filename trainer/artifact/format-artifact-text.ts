/**
 * Writes an artifact (any JSON value) as text a person can page through: one
 * field per line, nested objects indented, arrays of plain values on one line
 * with no spaces (a forest's thousands of numbers stay compact). Numbers are
 * written by JSON.stringify: the shortest text that reads back to the same double.
 *
 * @example
 * formatArtifactText({ a: [1, 0.1], b: { c: "x" } });
 * // '{\n  "a": [1,0.1],\n  "b": {\n    "c": "x"\n  }\n}\n'
 */
export function formatArtifactText(value: unknown): string {
  return `${format(value, "")}\n`;
}

function format(value: unknown, indent: string): string {
  if (Array.isArray(value)) {
    if (value.every((item) => item === null || typeof item !== "object"))
      return JSON.stringify(value);
    const inner = indent + "  ";
    return `[\n${value.map((item) => inner + format(item, inner)).join(",\n")}\n${indent}]`;
  }
  if (value !== null && typeof value === "object") {
    const record = value as { readonly [key: string]: unknown };
    const keys = Object.keys(record);
    if (keys.length === 0) return "{}";
    const inner = indent + "  ";
    const lines = keys.map(
      (key) => `${inner}${JSON.stringify(key)}: ${format(record[key], inner)}`,
    );
    return `{\n${lines.join(",\n")}\n${indent}}`;
  }
  const text = JSON.stringify(value);
  if (text === undefined)
    throw new TypeError(`artifact: expected a JSON value, found ${typeof value}`);
  return text;
}
