/** Parsing of ISO 8601 date-times as they appear in hourly weather files. */

const ISO_PATTERN =
  /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(?:\.(\d{1,9}))?)?\s*(Z|z|[+-]\d{2}(?::?\d{2})?)?$/;

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31] as const;

function daysInMonth(year: number, month: number): number {
  const leap = (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
  return month === 2 && leap ? 29 : (DAYS_IN_MONTH[month - 1] ?? 0);
}

/** Epoch milliseconds of a valid calendar date and time (UTC), or undefined when a part is out of range. */
export function utcMillis(
  year: number,
  month: number,
  day: number,
  hour: number,
  minute = 0,
  second = 0,
): number | undefined {
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
  const simple = simpleIsoDateTime(text);
  if (simple !== null) return simple;
  const m = ISO_PATTERN.exec(text.trim());
  if (m === null) return undefined;
  const [, ys, mos, ds, hs, mis, ss, fs, zone] = m;
  const base = utcMillis(
    Number(ys),
    Number(mos),
    Number(ds),
    Number(hs),
    Number(mis),
    ss === undefined ? 0 : Number(ss),
  );
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

/** Two decimal digits at `i` (NaN when either is not a digit). */
function twoDigits(text: string, i: number): number {
  const a = text.charCodeAt(i) - 48;
  const b = text.charCodeAt(i + 1) - 48;
  return a >= 0 && a <= 9 && b >= 0 && b <= 9 ? a * 10 + b : NaN;
}

/**
 * The common forms `2020-01-15T06:00`, `…:00`, each with or without `Z`, read without a regular
 * expression (a large upload has a quarter of a million of them); null for any other form, which
 * `parseIsoDateTime` then reads in full. Gives the same answer as the full reading.
 */
function simpleIsoDateTime(text: string): number | undefined | null {
  const n = text.length;
  const zulu = n === 17 || n === 20;
  if (n !== 16 && n !== 17 && n !== 19 && n !== 20) return null;
  if (zulu && text.charCodeAt(n - 1) !== 90 && text.charCodeAt(n - 1) !== 122) return null; // Z z
  const t = text.charCodeAt(10);
  if (text.charCodeAt(4) !== 45 || text.charCodeAt(7) !== 45 || (t !== 84 && t !== 32) || text.charCodeAt(13) !== 58)
    return null;
  const withSeconds = n >= 19;
  if (withSeconds && text.charCodeAt(16) !== 58) return null;
  const year = twoDigits(text, 0) * 100 + twoDigits(text, 2);
  const month = twoDigits(text, 5);
  const day = twoDigits(text, 8);
  const hour = twoDigits(text, 11);
  const minute = twoDigits(text, 14);
  const second = withSeconds ? twoDigits(text, 17) : 0;
  if (Number.isNaN(year + month + day + hour + minute + second)) return null;
  return utcMillis(year, month, day, hour, minute, second);
}
