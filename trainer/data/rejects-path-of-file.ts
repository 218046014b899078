/**
 * Where the rejects of input file `index` (0-based) of `fileCount` go: the
 * given path for a single file, else the path with the file's 1-based number
 * appended, so files read in one run never overwrite each other's rejects.
 *
 * @example
 * rejectsPathOfFile("bad.ndjson", 1, 3); // "bad.ndjson.2"
 */
export function rejectsPathOfFile(
  rejectsPath: string | undefined,
  index: number,
  fileCount: number,
): string | undefined {
  return rejectsPath === undefined || fileCount === 1 ? rejectsPath : `${rejectsPath}.${index + 1}`;
}
