/** Parsing of ISO 8601 date-times as they appear in hourly weather files. */

const ISO_PATTERN =
  /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(?:\.(\d{1,9}))?)?\s*(Z|z|[+-]\d{2}(?::?\d{2})?)?$/;

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31] as const;

function daysInMonth(year: number, month: number): number {
  const leap = (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
  return month === 2 && leap ? 29 : (DAYS_IN_MONTH[month - 1] ?? 0);
}

/** Epoch milliseconds of a valid calendar date and time (UTC), or undefined when a part is out of range. */
export function utcMillis(year: number, month: number, day: number, hour: number, minute = 0, second = 0): number | undefined {
  if (month < 1 || month > 12 || day < 1 || day > daysInMonth(year, month)) return undefined;
  if (hour < 0 || hour > 23 || minute < 0 || minute > 59 || second < 0 || second > 59) return undefined;
  return Date.UTC(year, month - 1, day, hour, minute, second);
}

/**
 * Parses `2020-01-15T06:00`, `2020-01-15 06:00`, with optional seconds and fraction, and an
 * optional `Z` or numeric offset (`+01:00`, `+0100`, `+01`). Without an offset the time is UTC.
 * Returns epoch milliseconds, or undefined when the text is not such a time.
 */
export function parseIsoDateTime(text: string): number | undefined {
  const m = ISO_PATTERN.exec(text.trim());
  if (m === null) return undefined;
  const [, ys, mos, ds, hs, mis, ss, fs, zone] = m;
  const base = utcMillis(Number(ys), Number(mos), Number(ds), Number(hs), Number(mis), ss === undefined ? 0 : Number(ss));
  if (base === undefined) return undefined;
  const fraction = fs === undefined ? 0 : Math.round(Number(`0.${fs}`) * 1000);
  let offsetMinutes = 0;
  if (zone !== undefined && zone !== 'Z' && zone !== 'z') {
    const sign = zone.startsWith('-') ? -1 : 1;
    const digits = zone.slice(1).replace(':', '');
    const oh = Number(digits.slice(0, 2));
    const om = digits.length > 2 ? Number(digits.slice(2, 4)) : 0;
    if (oh > 18 || om > 59) return undefined;
    offsetMinutes = sign * (oh * 60 + om);
  }
  return base + fraction - offsetMinutes * 60_000;
}
