import { isUtf8 } from "node:buffer";

const COMMA = 44;
const QUOTE = 34;
const LF = 10;
const CR = 13;

/** A parsed header: the column names, where the first data record starts, and what is wrong with it (null when nothing). */
export interface CsvHeader {
  readonly names: string[];
  readonly next: number;
  readonly problem: string | null;
}

/**
 * Reads the header record at the start of `buf` (RFC 4180 quoting). Returns the
 * column names and where the first data record starts, or null when the
 * header runs past the bytes so far and more may come (`eof` false). A header
 * that data rows would be refused for (a quote left open to the end of the
 * file, which would swallow every row into one name; text after a closing
 * quote; bytes that are not UTF-8, which would garble a name) comes back with
 * a `problem` for the reader to throw.
 *
 * @example
 * parseCsvHeader(Buffer.from('a,"b ""x""",c\r\n1,2,3'), false); // { names: ["a", 'b "x"', "c"], next: 15, problem: null }
 */
export function parseCsvHeader(buf: Buffer, eof: boolean): CsvHeader | null {
  const end = buf.length;
  // Nothing to do before a line break arrives: saves re-reading a very wide header once per chunk.
  if (!eof && buf.indexOf(LF) < 0 && buf.indexOf(CR) < 0) return null;
  const names: string[] = [];
  let problem: string | null = null;
  let p = 0;
  while (true) {
    if (p < end && buf[p] === QUOTE) {
      let k = p + 1;
      while (k < end && !(buf[k] === QUOTE && buf[k + 1] !== QUOTE)) k += buf[k] === QUOTE ? 2 : 1;
      if (k >= end - 1 && !eof) return null;
      if (k >= end) {
        problem ??= `the quoted name of column ${names.length + 1} is not closed before the end of the file`;
      }
      names.push(buf.toString("utf8", p + 1, Math.min(k, end)).replaceAll('""', '"'));
      p = k + 1;
      if (p < end && buf[p] !== COMMA && buf[p] !== LF && buf[p] !== CR) {
        problem ??= `the quoted name of column ${names.length} has text after its closing quote`;
        while (p < end && buf[p] !== COMMA && buf[p] !== LF && buf[p] !== CR) p++;
      }
    } else {
      let k = p;
      while (k < end && buf[k] !== COMMA && buf[k] !== LF && buf[k] !== CR) k++;
      if (k === end && !eof) return null;
      names.push(buf.toString("utf8", p, k));
      p = k;
    }
    if (p >= end) return finish(buf, names, end, problem);
    if (buf[p] === COMMA) {
      p++;
      continue;
    }
    if (buf[p] === CR) {
      if (p + 1 === end && !eof) return null;
      return finish(buf, names, buf[p + 1] === LF ? p + 2 : p + 1, problem);
    }
    return finish(buf, names, p + 1, problem);
  }
}

function finish(buf: Buffer, names: string[], next: number, problem: string | null): CsvHeader {
  if (problem === null && !isUtf8(buf.subarray(0, next))) {
    problem = "the header expected UTF-8 text, found bytes that are not UTF-8";
  }
  return { names, next, problem };
}
