/**
 * The scorer's own error type (the scorer imports nothing from the trainer, so it
 * cannot use LeafcastError; the shape is the same). Problems are gathered as coded
 * issues and thrown once, so a caller sees every problem of a damaged artifact.
 *
 * @example
 * throw new ScorerError("artifact", [
 *   { code: "out_of_range", path: "/forests/0/feature/17", message: "expected a feature index below 12, found 40" },
 * ]);
 * // message: 'artifact: /forests/0/feature/17: expected a feature index below 12, found 40'
 */
export interface ScorerIssue {
  /** A stable machine-readable code, e.g. "checksum", "out_of_range", "version". */
  readonly code: string;
  /** JSON Pointer of the offending value in the artifact or input ("" when it concerns the whole). */
  readonly path: string;
  /** Says expected versus found. */
  readonly message: string;
}

/** An error of the scorer: every problem found, as coded issues with paths. */
export class ScorerError extends Error {
  /** Where the problem was found: "artifact", "item", "batch", "model", ... */
  readonly source: string;
  readonly issues: readonly ScorerIssue[];

  constructor(source: string, issues: readonly ScorerIssue[]) {
    super(formatScorerIssues(source, issues));
    this.name = "ScorerError";
    this.source = source;
    this.issues = issues;
  }

  /** The first issue's code, for quick checks. */
  get code(): string {
    return this.issues[0]?.code ?? "unknown";
  }

  /** The first issue's path. */
  get path(): string {
    return this.issues[0]?.path ?? "";
  }
}

function formatScorerIssues(source: string, issues: readonly ScorerIssue[]): string {
  if (issues.length === 0) return `${source}: unknown problem`;
  const lines = issues
    .slice(0, 10)
    .map((issue) => `${source}: ${issue.path === "" ? "" : `${issue.path}: `}${issue.message}`);
  if (issues.length > 10) lines.push(`${source}: ... and ${issues.length - 10} more problems`);
  return lines.join("\n");
}
