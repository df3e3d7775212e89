/**
 * The readers' quick paths give exactly what the full readings give. Each quick path reads only the
 * common form of a cell or line; any other form falls through to the full reading, so these checks
 * compare the two on the same text (fast-check), the full reading being forced by one extra leading
 * character that the full reading ignores and the quick path does not accept.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import { parseDecimal } from '../../shared/climate/readers/parse-result';
import { parseIsoDateTime } from '../../shared/climate/readers/iso-time';
import { createIsdLiteParser } from '../../shared/climate/readers/isd-lite-reader';
import { createCsvParser } from '../../shared/climate/readers/csv-reader';

/** The number syntax the readers accept, as the regular expression that defined it. */
const DECIMAL = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

const digits = (min: number, max: number) => fc.integer({ min, max }).map((v) => String(v).padStart(2, '0'));

describe('readers: quick paths agree with the full readings', () => {
  it('a decimal cell is a number exactly when the syntax says so, and the same number', () => {
    const piece = fc.constantFrom(
      '',
      '+',
      '-',
      '.',
      'e',
      'E',
      '0',
      '7',
      '12',
      '.5',
      '5.',
      '1e5',
      'x',
      ' ',
      '-9999',
      'NaN',
      'Infinity',
      '0x1F',
      '١',
    );
    fc.assert(
      fc.property(
        fc.array(piece, { maxLength: 6 }).map((p) => p.join('')),
        (text) => {
          const expected = DECIMAL.test(text) ? Number(text) : undefined;
          assert.ok(
            Object.is(parseDecimal(text), expected),
            `${JSON.stringify(text)}: ${String(parseDecimal(text))} against ${String(expected)}`,
          );
        },
      ),
      { numRuns: 5000 },
    );
  });

  it('an ISO date-time of the common forms reads as the full reading reads it', () => {
    const time = fc
      .tuple(
        fc.integer({ min: 0, max: 9999 }).map((y) => String(y).padStart(4, '0')),
        digits(0, 13),
        digits(0, 32),
        fc.constantFrom('T', ' ', 't', '_'),
        digits(0, 25),
        digits(0, 61),
        fc.option(digits(0, 61)),
        fc.constantFrom('', 'Z', 'z', '+01:00'),
      )
      .map(([y, mo, d, sep, h, mi, s, zone]) => `${y}-${mo}-${d}${sep}${h}:${mi}${s === null ? '' : `:${s}`}${zone}`);
    fc.assert(
      fc.property(time, (text) => {
        // A leading space: the quick path declines, the full reading trims it.
        assert.equal(parseIsoDateTime(text), parseIsoDateTime(` ${text}`), text);
      }),
      { numRuns: 5000 },
    );
    assert.equal(parseIsoDateTime('2020-02-29T23:00Z'), Date.UTC(2020, 1, 29, 23));
    assert.equal(parseIsoDateTime('2021-02-29T23:00'), undefined);
  });

  it('an ISD-Lite line reads as the full reading reads it, values and problems', () => {
    const field = fc.oneof(
      fc.integer({ min: -99_999, max: 99_999 }).map(String),
      fc.constantFrom('-9999', '+5', '-0', '007', '1.5', 'x', '1234567890123456789'),
    );
    const line = fc
      .tuple(
        fc.integer({ min: 1990, max: 2030 }),
        fc.integer({ min: 0, max: 13 }),
        fc.integer({ min: 0, max: 32 }),
        fc.integer({ min: 0, max: 24 }),
        fc.array(field, { minLength: 7, maxLength: 9 }),
        fc.constantFrom(' ', '  ', '\t', ' \t'),
      )
      .map(([y, mo, d, h, rest, gap]) => [String(y), String(mo), String(d), String(h), ...rest].join(gap));
    fc.assert(
      fc.property(fc.array(line, { minLength: 1, maxLength: 5 }), (lines) => {
        const quick = createIsdLiteParser();
        const full = createIsdLiteParser();
        // A leading byte-order mark: the quick path declines, the full reading drops it.
        for (const l of lines) {
          quick.push(l);
          full.push(`\uFEFF${l}`);
        }
        assert.deepEqual(quick.finish(), full.finish());
      }),
      { numRuns: 2000 },
    );
  });

  it('a CSV row reads as the full reading reads it, values and problems', () => {
    const value = fc.oneof(
      fc.double({ min: -60, max: 60, noNaN: true }).map((v) => v.toFixed(1)),
      fc.integer({ min: -1000, max: 1000 }).map((v) => (v / 100).toString()),
      fc.constantFrom(
        '',
        '-9999',
        'NA',
        'n/a',
        '-0',
        '0.',
        '.5',
        '+3',
        '1e2',
        '12345678901234567',
        '1.2.3',
        'x',
        '-',
        '.',
      ),
    );
    const row = fc
      .tuple(fc.integer({ min: 0, max: 3 * 8760 }), value, value, value, fc.boolean())
      .map(([h, db, dp, ws, bad]) => [
        bad ? '2020-13-01T00:00' : new Date(Date.UTC(2020, 0, 1) + h * 3_600_000).toISOString().slice(0, 16),
        db,
        dp,
        ws,
      ]);
    fc.assert(
      fc.property(fc.array(row, { minLength: 1, maxLength: 6 }), fc.constantFrom('F', 'C'), (rows, scale) => {
        const header = `time,dry_bulb_${scale.toLowerCase()},dew_point_c,wind_speed_kn`;
        const quick = createCsvParser();
        const full = createCsvParser();
        quick.push(header);
        full.push(header);
        // A space after every delimiter: the quick path declines, the full reading trims it.
        for (const cells of rows) {
          quick.push(cells.join(','));
          full.push(cells.join(', '));
        }
        assert.deepEqual(quick.finish(), full.finish());
      }),
      { numRuns: 3000 },
    );
  });
});
