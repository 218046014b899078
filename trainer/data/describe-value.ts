const limit = 60;

/**
 * How a found value appears in an error message: text in quotes (clipped),
 * numbers and booleans bare, objects as clipped JSON.
 *
 * @example
 * describeValue("n/a"); // '"n/a"'
 * describeValue(2); // "2"
 * describeValue({ a: 1 }); // 'an object {"a":1}'
 */
export function describeValue(value: unknown): string {
  if (typeof value === "string") return JSON.stringify(clip(value));
  if (typeof value === "number" || typeof value === "boolean" || typeof value === "bigint") {
    return String(value);
  }
  if (value === null || value === undefined) return "null";
  if (value instanceof Date)
    return `the time ${Number.isNaN(value.getTime()) ? "Invalid Date" : value.toISOString()}`;
  const kind = Array.isArray(value)
    ? "an array"
    : ArrayBuffer.isView(value)
      ? "binary data"
      : "an object";
  let json: string;
  try {
    json =
      JSON.stringify(value, (_key, v: unknown) => (typeof v === "bigint" ? String(v) : v)) ?? "";
  } catch {
    json = "";
  }
  return json === "" ? kind : `${kind} ${clip(json)}`;
}

function clip(text: string): string {
  return text.length > limit ? `${text.slice(0, limit)}...` : text;
}
