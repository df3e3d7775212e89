/**
 * Money arithmetic in decimal, rounding half-even to cents, and formatting with Intl.NumberFormat.
 * Expected values are exact decimal arithmetic [C]; half-even rounding is the "round half to even"
 * rule of IEEE 754-2008 §4.3.1 (roundTiesToEven) [M].
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import {
  addMoney,
  currencyDecimals,
  divideMoney,
  formatMoney,
  formatMoneyWhole,
  moneyStringSchema,
  multiplyMoney,
  parseMoney,
  roundToCents,
  roundToCurrency,
  subtractMoney,
  sumMoney,
  toMoneyString,
} from '../../shared/money/money';

describe('money arithmetic', () => {
  it('0.1 + 0.2 = 0.30 exactly (binary floating point gives 0.30000000000000004)', () => {
    assert.notEqual(0.1 + 0.2, 0.3); // why money never uses floats
    const sum = addMoney('0.1', '0.2');
    assert.ok(sum.equals(parseMoney('0.3')));
    assert.equal(toMoneyString(sum), '0.30');
  });

  it('summing 1000 × 0.01 gives exactly 10.00', () => {
    let float = 0;
    for (let i = 0; i < 1000; i++) float += 0.01;
    assert.notEqual(float, 10);
    const total = sumMoney(Array.from({ length: 1000 }, () => '0.01'));
    assert.equal(total.toString(), '10');
    assert.equal(toMoneyString(total), '10.00');
  });

  it('multiplies a price by a number of units and subtracts exactly', () => {
    // [C] 0.1523 × 1234.5 kWh = 188.01435 → 188.01 (half-even, the dropped part 0.00435 < 0.005).
    assert.equal(multiplyMoney('0.1523', 1234.5).toString(), '188.01435');
    assert.equal(toMoneyString(roundToCents(multiplyMoney('0.1523', 1234.5))), '188.01');
    assert.equal(multiplyMoney('19.99', 3).toString(), '59.97');
    assert.equal(subtractMoney('100.00', '0.01').toString(), '99.99');
    assert.equal(divideMoney('10', 4).toString(), '2.5');
    assert.throws(() => divideMoney('10', 0), RangeError);
    assert.throws(() => multiplyMoney('10', Number.NaN), RangeError);
  });

  it('rounds half to even at the cent', () => {
    const cases: [string, string][] = [
      ['1.005', '1.00'],
      ['1.015', '1.02'],
      ['1.025', '1.02'],
      ['2.675', '2.68'],
      ['2.665', '2.66'],
      ['-1.005', '-1.00'],
      ['-1.015', '-1.02'],
      ['0.0051', '0.01'],
      ['0.0049', '0.00'],
    ];
    for (const [input, expected] of cases) assert.equal(toMoneyString(roundToCents(input)), expected, input);
  });

  it('parses amounts strictly', () => {
    assert.equal(parseMoney(' 1234.50 ').toFixed(2), '1234.50');
    assert.equal(parseMoney('-7').toString(), '-7');
    for (const bad of ['1,234.50', '$12', '1e3', '', '.5', '12.'])
      assert.throws(() => parseMoney(bad), RangeError, bad);
  });

  it('checks installed prices: digits with at most two decimals', () => {
    assert.ok(moneyStringSchema.safeParse('8450.00').success);
    assert.ok(moneyStringSchema.safeParse('8450').success);
    for (const bad of ['8 450', '8450.005', '-1', 'abc'])
      assert.equal(moneyStringSchema.safeParse(bad).success, false, bad);
  });

  it('property: the decimal sum of cent amounts equals the integer sum of cents', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: 10_000_000 }), { maxLength: 200 }), (cents) => {
        const text = cents.map((c) => `${Math.floor(c / 100)}.${String(c % 100).padStart(2, '0')}`);
        const expected = cents.reduce((a, b) => a + b, 0);
        return sumMoney(text).times(100).equals(expected);
      }),
    );
  });
});

describe('currency formatting (Intl.NumberFormat, ISO 4217 minor units)', () => {
  it('formats with the currency symbol and the locale grouping', () => {
    assert.equal(formatMoney('1234.5', 'USD'), '$1,234.50');
    assert.equal(formatMoney('1234.5', 'CAD', 'en-CA'), '$1,234.50');
    // de-DE groups with "." and uses "," for decimals; the space before € is a no-break space.
    assert.equal(formatMoney('1234.565', 'EUR', 'de-DE').replace(/\s/g, ' '), '1.234,56 €');
    assert.equal(formatMoney('-0.125', 'USD'), '-$0.12');
  });

  it('rounds to whole units, half to even, for summaries and reports', () => {
    // Half-even rounding as in the decimal.js documentation of ROUND_HALF_EVEN [S]; grouping as in the cases above.
    assert.equal(formatMoneyWhole('1234.50', 'USD'), '$1,234');
    assert.equal(formatMoneyWhole('1235.50', 'USD'), '$1,236');
    assert.equal(formatMoneyWhole('22923.49', 'USD'), '$22,923');
    assert.equal(formatMoneyWhole('1234.5', 'EUR', 'de-DE').replace(/\s/g, ' '), '1.234 €');
  });

  it('rounds half to even to the currency minor unit before formatting', () => {
    // ISO 4217 minor units [M]: USD 2, JPY 0, BHD 3.
    assert.equal(currencyDecimals('USD'), 2);
    assert.equal(currencyDecimals('JPY'), 0);
    assert.equal(currencyDecimals('BHD'), 3);
    assert.equal(roundToCurrency('2.5', 'JPY').toString(), '2');
    assert.equal(roundToCurrency('3.5', 'JPY').toString(), '4');
    assert.equal(formatMoney('1234.5', 'JPY', 'en-US'), '¥1,234');
    // A large total keeps every digit (no float in between).
    assert.equal(formatMoney('12345678901234567.125', 'USD'), '$12,345,678,901,234,567.12');
  });
});
