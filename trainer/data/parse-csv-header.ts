const COMMA = 44;
const QUOTE = 34;
const LF = 10;
const CR = 13;

/**
 * Reads the header record at the start of `buf` (RFC 4180 quoting). Returns the
 * column names and where the first data record starts, or null when the
 * header runs past the bytes so far and more may come (`eof` false). A header
 * with an unclosed quote at the end of the file is returned as read.
 *
 * @example
 * parseCsvHeader(Buffer.from('a,"b ""x""",c\r\n1,2,3'), false); // { names: ["a", 'b "x"', "c"], next: 15 }
 */
export function parseCsvHeader(
  buf: Buffer,
  eof: boolean,
): { names: string[]; next: number } | null {
  const names: string[] = [];
  const end = buf.length;
  let p = 0;
  while (true) {
    if (p < end && buf[p] === QUOTE) {
      let k = p + 1;
      while (k < end && !(buf[k] === QUOTE && buf[k + 1] !== QUOTE)) k += buf[k] === QUOTE ? 2 : 1;
      if (k >= end - 1 && !eof) return null;
      names.push(buf.toString("utf8", p + 1, Math.min(k, end)).replaceAll('""', '"'));
      p = k + 1;
      while (p < end && buf[p] !== COMMA && buf[p] !== LF && buf[p] !== CR) p++;
    } else {
      let k = p;
      while (k < end && buf[k] !== COMMA && buf[k] !== LF && buf[k] !== CR) k++;
      if (k === end && !eof) return null;
      names.push(buf.toString("utf8", p, k));
      p = k;
    }
    if (p >= end) return { names, next: end };
    if (buf[p] === COMMA) {
      p++;
      continue;
    }
    if (buf[p] === CR) {
      if (p + 1 === end && !eof) return null;
      return { names, next: buf[p + 1] === LF ? p + 2 : p + 1 };
    }
    return { names, next: p + 1 };
  }
}
