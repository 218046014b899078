import { writeFileAtomic } from "../io/write-file-atomic.js";
import { renderReport } from "./render-report.js";
import type { ReportInput } from "./report-input.js";

/**
 * Renders the report and writes it in one atomic step, so a reader never opens a
 * half-written page; returns the HTML's size in bytes.
 *
 * @example
 * const bytes = await writeReport("runs/demo/report.html", input);
 */
export async function writeReport(path: string, input: ReportInput): Promise<number> {
  const bytes = new TextEncoder().encode(await renderReport(input));
  await writeFileAtomic(path, bytes);
  return bytes.length;
}
