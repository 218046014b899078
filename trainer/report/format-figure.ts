/** How a figure is shown. */
export type FigureKind = "count" | "percent" | "metric" | "psi" | "ns";

/**
 * Formats a number for the report the same way on every machine (no locale, no clock):
 * counts with thousands separators, rates as percent, metrics to four decimals,
 * nanoseconds in ns, µs or ms. Non-finite values read "n/a" (e.g. AUC when one class is
 * absent).
 *
 * @example
 * formatFigure(12345, "count"); // "12,345"
 * formatFigure(0.03125, "percent"); // "3.13 %"
 * formatFigure(1734, "ns"); // "1.73 µs"
 */
export function formatFigure(value: number, kind: FigureKind): string {
  if (!Number.isFinite(value)) return "n/a";
  switch (kind) {
    case "count":
      return groupThousands(Math.round(value));
    case "percent":
      return `${(value * 100).toFixed(value !== 0 && Math.abs(value) < 0.001 ? 4 : 2)} %`;
    case "metric":
      return value.toFixed(4);
    case "psi":
      return value.toFixed(3);
    case "ns":
      return formatNanoseconds(value);
  }
}

function groupThousands(n: number): string {
  const sign = n < 0 ? "-" : "";
  const digits = String(Math.abs(n));
  return sign + digits.replace(/\B(?=(\d{3})+(?!\d))/g, ",");
}

function formatNanoseconds(ns: number): string {
  if (ns < 1_000) return `${ns < 10 ? ns.toFixed(1) : Math.round(ns)} ns`;
  if (ns < 1_000_000) return `${threeFigures(ns / 1_000)} µs`;
  return `${threeFigures(ns / 1_000_000)} ms`;
}

function threeFigures(x: number): string {
  return x < 10 ? x.toFixed(2) : x < 100 ? x.toFixed(1) : x.toFixed(0);
}
