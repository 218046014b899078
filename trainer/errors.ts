/**
 * Leafcast's own error type. Problems are gathered as coded issues (data) and thrown
 * once, so a caller (or a test) can read every problem, not just the first.
 *
 * @example
 * throw new LeafcastError("csv", [{ code: "not_a_number", message: 'column "tie_strength" expected a number, found "n/a"', file: "plots.csv", row: 17, column: "tie_strength" }]);
 */
export interface Issue {
  /** A stable machine-readable code, e.g. "not_a_number", "missing_column". */
  readonly code: string;
  /** Says expected versus found. */
  readonly message: string;
  readonly file?: string;
  /** 1-based data row (the header is not counted). */
  readonly row?: number;
  readonly column?: string;
}

export class LeafcastError extends Error {
  /** Where the problem was found: "csv", "schema", "config", "artifact", ... */
  readonly source: string;
  readonly issues: readonly Issue[];

  constructor(source: string, issues: readonly Issue[]) {
    super(formatIssues(source, issues));
    this.name = "LeafcastError";
    this.source = source;
    this.issues = issues;
  }

  /** The first issue's code, for quick checks. */
  get code(): string {
    return this.issues[0]?.code ?? "unknown";
  }
}

/** Formats as `csv: column "x" expected a number, found "n/a" (plots.csv row 17)`. */
export function formatIssue(source: string, issue: Issue): string {
  const where: string[] = [];
  if (issue.file !== undefined) where.push(issue.file);
  if (issue.row !== undefined) where.push(`row ${issue.row}`);
  const suffix = where.length > 0 ? ` (${where.join(" ")})` : "";
  return `${source}: ${issue.message}${suffix}`;
}

function formatIssues(source: string, issues: readonly Issue[]): string {
  if (issues.length === 0) return `${source}: unknown problem`;
  const lines = issues.slice(0, 10).map((issue) => formatIssue(source, issue));
  if (issues.length > 10) lines.push(`${source}: ... and ${issues.length - 10} more problems`);
  return lines.join("\n");
}
