/**
 * The canonical text of a JSON value, which the artifact checksum is computed over:
 * no whitespace; object keys sorted by UTF-16 code units (JavaScript's default
 * sort); strings and numbers exactly as JSON.stringify writes them (numbers as the
 * shortest text that reads back to the same double, -0 as 0); `omitKey`, when
 * given, left out of the top-level object only.
 *
 * Any conforming JSON writer can reproduce it, so a checksum can be checked
 * without this code.
 *
 * @example
 * canonicalJson({ b: [1, 0.1], a: "x", checksum: "..." }, "checksum"); // '{"a":"x","b":[1,0.1]}'
 */
export function canonicalJson(value: unknown, omitKey?: string): string {
  const out: string[] = [];
  write(value, out, omitKey, 0);
  return out.join("");
}

const MAX_DEPTH = 200;

function write(value: unknown, out: string[], omitKey: string | undefined, depth: number): void {
  if (depth > MAX_DEPTH) throw new RangeError(`canonical JSON: nesting deeper than ${MAX_DEPTH}`);
  if (value === null || typeof value === "boolean" || typeof value === "string") {
    out.push(JSON.stringify(value));
  } else if (typeof value === "number") {
    if (!Number.isFinite(value)) {
      throw new RangeError(`canonical JSON: expected a finite number, found ${value}`);
    }
    out.push(JSON.stringify(value));
  } else if (Array.isArray(value)) {
    if (isPlainValues(value)) {
      out.push(JSON.stringify(value)); // the same text, written natively: forests are long arrays of numbers
      return;
    }
    out.push("[");
    for (let i = 0; i < value.length; i++) {
      if (i > 0) out.push(",");
      write(value[i], out, undefined, depth + 1);
    }
    out.push("]");
  } else if (typeof value === "object") {
    const record = value as { readonly [key: string]: unknown };
    const keys = Object.keys(record)
      .filter((key) => key !== omitKey)
      .sort();
    out.push("{");
    keys.forEach((key, i) => {
      if (i > 0) out.push(",");
      out.push(JSON.stringify(key), ":");
      write(record[key], out, undefined, depth + 1);
    });
    out.push("}");
  } else {
    throw new TypeError(`canonical JSON: expected a JSON value, found ${typeof value}`);
  }
}

/** True for an array of strings, booleans, nulls and finite numbers only. */
function isPlainValues(values: readonly unknown[]): boolean {
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (typeof v === "number") {
      if (!Number.isFinite(v)) return false;
    } else if (v !== null && typeof v !== "string" && typeof v !== "boolean") {
      return false;
    }
  }
  return true;
}
