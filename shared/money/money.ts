/**
 * Money arithmetic with decimal.js: amounts are decimal strings ("1234.50") or Decimal values, never
 * binary floating point. Rounding to cents is half-even ("banker's rounding"). Formatting goes
 * through Intl.NumberFormat with an ISO 4217 currency code, after rounding here, so that the
 * formatter never rounds on its own.
 */
import { Decimal } from 'decimal.js';
import { z } from 'zod';

/** decimal.js constructor for money: 40 significant digits, half-even rounding, never exponent notation. */
export const MoneyDecimal = Decimal.clone({
  precision: 40,
  rounding: Decimal.ROUND_HALF_EVEN,
  toExpNeg: -40,
  toExpPos: 40,
});

/** An amount: a Decimal or a decimal string such as "1234.50" or "-0.125". */
export type MoneyValue = Decimal | string;

const DECIMAL_TEXT = /^-?\d+(\.\d+)?$/;

/** Parses a decimal amount such as "1234.50" (no thousands separators, no currency sign). Throws RangeError. */
export function parseMoney(text: string): Decimal {
  const t = text.trim();
  if (!DECIMAL_TEXT.test(t)) throw new RangeError(`"${text}" is not an amount such as 1234.50`);
  return new MoneyDecimal(t);
}

function toDecimal(value: MoneyValue): Decimal {
  return typeof value === 'string' ? parseMoney(value) : new MoneyDecimal(value);
}

/** The sum of amounts (exact). */
export function addMoney(...values: MoneyValue[]): Decimal {
  return sumMoney(values);
}

/** The sum of a list of amounts (exact). */
export function sumMoney(values: Iterable<MoneyValue>): Decimal {
  let total = new MoneyDecimal(0);
  for (const v of values) total = total.plus(toDecimal(v));
  return total;
}

/** An amount minus another (exact). */
export function subtractMoney(a: MoneyValue, b: MoneyValue): Decimal {
  return toDecimal(a).minus(toDecimal(b));
}

/**
 * An amount times a number of units (a price per kWh × kWh, a unit price × a count). The quantity
 * may be a float (a physical quantity); it enters the product as the decimal that JavaScript
 * prints for it, and the product is computed in decimal.
 */
export function multiplyMoney(amount: MoneyValue, units: number | Decimal | string): Decimal {
  if (typeof units === 'number' && !Number.isFinite(units))
    throw new RangeError('The quantity must be a finite number');
  return toDecimal(amount).times(new MoneyDecimal(units));
}

/** An amount divided by a quantity (a price per kWh of fuel ÷ an efficiency or a COP). */
export function divideMoney(amount: MoneyValue, by: number | Decimal | string): Decimal {
  const d = new MoneyDecimal(by);
  if (!d.isFinite() || d.isZero()) throw new RangeError('Cannot divide an amount by zero');
  return toDecimal(amount).div(d);
}

/** Rounds to whole cents, half to even (1.005 → 1.00, 1.015 → 1.02, 2.675 → 2.68). */
export function roundToCents(amount: MoneyValue): Decimal {
  return toDecimal(amount).toDecimalPlaces(2, Decimal.ROUND_HALF_EVEN);
}

/** Number of minor-unit digits of a currency (USD 2, JPY 0, BHD 3), from Intl. */
export function currencyDecimals(currency: string): number {
  return new Intl.NumberFormat('en-US', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
}

/** Rounds to the currency's minor unit, half to even. */
export function roundToCurrency(amount: MoneyValue, currency: string): Decimal {
  return toDecimal(amount).toDecimalPlaces(currencyDecimals(currency), Decimal.ROUND_HALF_EVEN);
}

/** A plain decimal string with a fixed number of decimals (default 2), rounded half-even: "1234.50". */
export function toMoneyString(amount: MoneyValue, decimals = 2): string {
  return toDecimal(amount).toFixed(decimals, Decimal.ROUND_HALF_EVEN);
}

/** An amount for display, e.g. formatMoney("1234.5", "USD") → "$1,234.50", rounded half-even to the currency's minor unit. */
export function formatMoney(amount: MoneyValue, currency: string, locale = 'en-US'): string {
  const decimals = currencyDecimals(currency);
  const text = toDecimal(amount).toFixed(decimals, Decimal.ROUND_HALF_EVEN) as `${number}`;
  return new Intl.NumberFormat(locale, {
    style: 'currency',
    currency,
    minimumFractionDigits: decimals,
    maximumFractionDigits: decimals,
  }).format(text);
}

/**
 * An amount to whole currency units for summaries and reports, e.g. "$1,235" (half-even, so
 * "1234.50" → "$1,234"); cents stay for the CSV exports and the amounts an estimator types.
 */
export function formatMoneyWhole(amount: MoneyValue, currency: string, locale = 'en-US'): string {
  const text = toDecimal(amount).toFixed(0, Decimal.ROUND_HALF_EVEN) as `${number}`;
  return new Intl.NumberFormat(locale, {
    style: 'currency',
    currency,
    minimumFractionDigits: 0,
    maximumFractionDigits: 0,
  }).format(text);
}

// ---------------------------------------------------------------------------------------------
// Schemas

/** ISO 4217 alphabetic currency code. */
export const currencyCodeSchema = z
  .string({ error: 'Enter a currency code such as USD, CAD or EUR' })
  .trim()
  .regex(/^[A-Z]{3}$/, 'Enter a three-letter currency code in capitals, such as USD, CAD or EUR');

/** A non-negative amount with at most two decimals, as a string: "1234.50". */
export const moneyStringSchema = z
  .string({ error: 'Enter the amount as text such as 1234.50' })
  .trim()
  .regex(/^\d{1,13}(\.\d{1,2})?$/, 'Enter an amount such as 1234.50 (digits, a decimal point and at most 2 decimals)');

/** A non-negative unit price with at most six decimals: "0.1523" per kWh. */
export const UNIT_PRICE_PATTERN = /^\d{1,9}(\.\d{1,6})?$/;

/** A non-negative unit price with at most six decimals, as a string. */
export const unitPriceStringSchema = z
  .string({ error: 'Enter the price as text such as 0.1523' })
  .trim()
  .regex(UNIT_PRICE_PATTERN, 'Enter a price such as 0.1523 (digits, a decimal point and at most 6 decimals)');
