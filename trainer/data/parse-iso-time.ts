const isoTime =
  /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(?:\.(\d{1,9}))?)?(Z|[+-]\d{2}:?\d{2})?)?$/;

/**
 * Reads ISO 8601 text as milliseconds since the Unix epoch, or NaN when the
 * text is not an ISO 8601 date or date-time. A date-time without a zone is
 * taken as UTC (not the machine's local zone), so a file reads the same on
 * every machine. Impossible dates such as 2024-02-30 are refused (the built-in
 * parser would roll them into March).
 *
 * @example
 * parseIsoTime("2024-05-01T10:00:00Z"); // 1714557600000
 * parseIsoTime("2024-05-01"); // 1714521600000
 */
export function parseIsoTime(text: string): number {
  const match = isoTime.exec(text);
  if (match === null) return Number.NaN;
  const [, y, mo, d, h, mi, s, fraction, zone] = match;
  const year = Number(y);
  const month = Number(mo);
  const day = Number(d);
  const hour = h === undefined ? 0 : Number(h);
  const minute = mi === undefined ? 0 : Number(mi);
  const second = s === undefined ? 0 : Number(s);
  if (month < 1 || month > 12 || day < 1 || day > daysInMonth(year, month)) return Number.NaN;
  if (hour > 23 || minute > 59 || second > 59) return Number.NaN;
  const millis = fraction === undefined ? 0 : Number(`0.${fraction}`) * 1000;
  let offsetMinutes = 0;
  if (zone !== undefined && zone !== "Z") {
    const sign = zone[0] === "-" ? -1 : 1;
    const digits = zone.slice(1).replace(":", "");
    const zoneHours = Number(digits.slice(0, 2));
    const zoneMinutes = Number(digits.slice(2));
    if (zoneHours > 23 || zoneMinutes > 59) return Number.NaN;
    offsetMinutes = sign * (zoneHours * 60 + zoneMinutes);
  }
  // setUTCFullYear, not Date.UTC, which maps years 0 to 99 onto 1900 to 1999.
  const date = new Date(0);
  date.setUTCFullYear(year, month - 1, day);
  date.setUTCHours(hour, minute, second, 0);
  return date.getTime() + Math.round(millis) - offsetMinutes * 60_000;
}

function daysInMonth(year: number, month: number): number {
  if (month === 2) return year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0) ? 29 : 28;
  return month === 4 || month === 6 || month === 9 || month === 11 ? 30 : 31;
}
